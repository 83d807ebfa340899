import { barcodeLookupSchema, partBarcodeSchema, type BarcodeLookup, type PartBarcode } from '@tappet/contracts';
import { api, ApiError } from '../../../lib/api-client';

/** Looks like a supplier barcode (EAN-8, UPC-A, EAN-13, GTIN-14) rather than a part number. */
export function looksLikeGtin(code: string): boolean {
  return /^(\d{8}|\d{12}|\d{13}|\d{14})$/.test(code.replace(/[\s-]/g, ''));
}

/** GET /api/shops/:shopId/barcodes/:code: the part a scanned barcode names; `unknown` when none has it yet. */
export async function findBarcode(shopId: string, code: string): Promise<BarcodeLookup | 'unknown'> {
  try {
    return await api.get(`/shops/${encodeURIComponent(shopId)}/barcodes/${encodeURIComponent(code.replace(/[\s-]/g, ''))}`, { schema: barcodeLookupSchema });
  } catch (error) {
    if (error instanceof ApiError && error.status === 404) return 'unknown';
    throw error;
  }
}

/** POST /api/shops/:shopId/parts/:partId/barcodes: attaches a supplier barcode (GS1 check digit checked by the API). */
export function attachBarcode(shopId: string, partId: string, code: string): Promise<PartBarcode> {
  return api.post(`/shops/${encodeURIComponent(shopId)}/parts/${encodeURIComponent(partId)}/barcodes`, { code }, { schema: partBarcodeSchema });
}
