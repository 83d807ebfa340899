import { z } from 'zod';
import { idSchema } from './common';

// Supplier barcodes (issue 7): EAN/UPC/GTIN numbers attached to parts. The GS1 check digit is
// validated by the API (libs/domain validateGs1, GS1 General Specifications §7.9.1).

/** A GTIN as scanned or typed: 8, 12, 13 or 14 digits (spaces and dashes are dropped). */
export const gtinInputSchema = z
  .string({ error: 'Enter the barcode number.' })
  .transform((s) => s.replace(/[\s-]/g, ''))
  .pipe(z.string().regex(/^(\d{8}|\d{12}|\d{13}|\d{14})$/, 'A barcode number has 8, 12, 13 or 14 digits (EAN-8, UPC-A, EAN-13 or GTIN-14).'));

export const barcodeInputSchema = z.object({ code: gtinInputSchema }).strict();
export type BarcodeInput = z.input<typeof barcodeInputSchema>;

export const partBarcodeParamsSchema = z.object({ shopId: idSchema, partId: idSchema }).strict();
export const partBarcodeIdParamsSchema = z.object({ shopId: idSchema, partId: idSchema, barcodeId: idSchema }).strict();
export const barcodeCodeParamsSchema = z.object({ shopId: idSchema, code: z.string().max(40) }).strict();

export const partBarcodeSchema = z.object({
  id: idSchema,
  partId: idSchema,
  /** As attached (8, 12, 13 or 14 digits). */
  code: z.string(),
  kind: z.enum(['GTIN-8', 'GTIN-12', 'GTIN-13', 'GTIN-14']),
  createdAt: z.string(),
});
export type PartBarcode = z.infer<typeof partBarcodeSchema>;

export const partBarcodeListSchema = z.object({ barcodes: z.array(partBarcodeSchema) });

/** What a scanned barcode names. */
export const barcodeLookupSchema = z.object({
  barcode: partBarcodeSchema,
  part: z.object({ id: idSchema, number: z.string(), description: z.string() }),
});
export type BarcodeLookup = z.infer<typeof barcodeLookupSchema>;
