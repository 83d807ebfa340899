import { z } from 'zod';
import { idSchema } from './common';
import { labelSheetFormats } from './settings';

/** A label format: a sheet layout or a single label for a roll printer. */
export const labelFormatSchema = z.enum(labelSheetFormats);
export type LabelFormat = z.infer<typeof labelFormatSchema>;

/**
 * Geometry of one label format, in millimetres, measured from the top-left corner of the page.
 * Labels fill the page row by row: `columns` across, `rows` down; the label in column c and row r
 * sits at x = marginLeft + c × (labelWidth + gapX), y = marginTop + r × (labelHeight + gapY).
 */
export interface LabelSheetLayout {
  id: LabelFormat;
  /** What a person reads in a format choice. */
  name: string;
  pageWidthMm: number;
  pageHeightMm: number;
  columns: number;
  rows: number;
  labelWidthMm: number;
  labelHeightMm: number;
  marginLeftMm: number;
  marginTopMm: number;
  gapXMm: number;
  gapYMm: number;
}

const inch = 25.4;

/**
 * The three formats. Where the numbers come from:
 * - A4 (210 × 297 mm), 3 × 8 labels of 70 × 37 mm: 3 × 70 = 210, so no side margins and no gaps
 *   (the common edge-to-edge "24 per sheet" layout); 8 × 37 = 296, leaving 1 mm, split as 0.5 mm
 *   top and bottom (centred: our arithmetic; the edge-to-edge layout is from memory, check it
 *   against the sheet's own data sheet before buying stock).
 * - US Letter (8.5 × 11 in), 3 × 10 labels of 2⅝ × 1 in (66.675 × 25.4 mm; the brief rounds to
 *   66.7): top and bottom margins ½ in, side margins 3⁄16 in, ⅛ in between columns, none between
 *   rows. These are the usual "30 per sheet" address-label figures, from memory; they add up
 *   exactly (3/16 × 2 + 2⅝ × 3 + ⅛ × 2 = 8.5 in; ½ × 2 + 1 × 10 = 11 in).
 * - Roll, 62 × 29 mm: one label per page of exactly that size, as label printers with continuous
 *   or die-cut 62 mm rolls expect (common practice).
 */
export const labelSheetLayouts: Record<LabelFormat, LabelSheetLayout> = {
  'a4-3x8': {
    id: 'a4-3x8',
    name: 'A4 sheet, 3 × 8 labels (70 × 37 mm)',
    pageWidthMm: 210,
    pageHeightMm: 297,
    columns: 3,
    rows: 8,
    labelWidthMm: 70,
    labelHeightMm: 37,
    marginLeftMm: 0,
    marginTopMm: 0.5,
    gapXMm: 0,
    gapYMm: 0,
  },
  'letter-3x10': {
    id: 'letter-3x10',
    name: 'US Letter sheet, 3 × 10 labels (66.7 × 25.4 mm)',
    pageWidthMm: 8.5 * inch,
    pageHeightMm: 11 * inch,
    columns: 3,
    rows: 10,
    labelWidthMm: 2.625 * inch,
    labelHeightMm: inch,
    marginLeftMm: (3 / 16) * inch,
    marginTopMm: 0.5 * inch,
    gapXMm: 0.125 * inch,
    gapYMm: 0,
  },
  'roll-62x29': {
    id: 'roll-62x29',
    name: 'Single labels on a roll (62 × 29 mm)',
    pageWidthMm: 62,
    pageHeightMm: 29,
    columns: 1,
    rows: 1,
    labelWidthMm: 62,
    labelHeightMm: 29,
    marginLeftMm: 0,
    marginTopMm: 0,
    gapXMm: 0,
    gapYMm: 0,
  },
};

/** Labels per page of a format. */
export const labelsPerPage = (format: LabelFormat): number => labelSheetLayouts[format].columns * labelSheetLayouts[format].rows;

/** Pages needed for `count` labels after `skip` positions already used on the first sheet. */
export const labelPageCount = (format: LabelFormat, count: number, skip = 0): number => Math.ceil((count + skip) / labelsPerPage(format));

/** At most this many labels in one request (keeps a PDF a few hundred KB and its render short). */
export const maxLabelsPerRequest = 600;
/** At most this many different parts in one request. */
export const maxLabelPartsPerRequest = 200;
/**
 * At most this many different codes in one request (each QR code takes about 10 ms to encode;
 * copies of one code are encoded once).
 */
export const maxDistinctLabelsPerRequest = 200;
/** At most this many copies of each label. */
export const maxLabelCopies = 50;

/** What the print dialog needs: the shop's default format and every format. */
export const labelOptionsSchema = z.object({
  defaultFormat: labelFormatSchema,
  formats: z.array(
    z.object({
      id: labelFormatSchema,
      name: z.string(),
      labelsPerPage: z.number().int(),
      labelWidthMm: z.number(),
      labelHeightMm: z.number(),
    }),
  ),
});
export type LabelOptions = z.infer<typeof labelOptionsSchema>;

/** Labels for chosen parts: each part `copies` times, in the order given. */
export const partLabelsRequestSchema = z
  .object({
    partIds: z
      .array(idSchema)
      .min(1, 'Choose at least one part.')
      .max(maxLabelPartsPerRequest, `Print labels for at most ${maxLabelPartsPerRequest} parts at a time.`)
      .refine((ids) => new Set(ids).size === ids.length, 'Each part at most once; use copies for more labels.'),
    copies: z.number().int('Use a whole number of copies.').min(1, 'Print at least one copy.').max(maxLabelCopies, `Print at most ${maxLabelCopies} copies of each label.`).default(1),
    /** Omitted: the shop's default format. */
    format: labelFormatSchema.optional(),
    /** Label positions already used on the first sheet (a partly used sheet); ignored on rolls. */
    skip: z.number().int().min(0).max(29, 'A sheet has at most 30 labels.').default(0),
  })
  .strict()
  .refine((v) => v.partIds.length * v.copies <= maxLabelsPerRequest, { message: `Print at most ${maxLabelsPerRequest} labels at a time.`, path: ['copies'] });
export type PartLabelsRequest = z.input<typeof partLabelsRequestSchema>;
export type PartLabelsRequestParsed = z.output<typeof partLabelsRequestSchema>;

/** The label PDF's media type. */
export const labelPdfMediaType = 'application/pdf';

/** At most this many bins in one request. */
export const maxLabelBinsPerRequest = 100;

/**
 * Labels for bins: one label per bin (its code in the symbols) and, with `contents`, after each
 * bin a label for every part stocked in it.
 */
export const binLabelsRequestSchema = z
  .object({
    binIds: z
      .array(idSchema)
      .min(1, 'Choose at least one bin.')
      .max(maxLabelBinsPerRequest, `Print labels for at most ${maxLabelBinsPerRequest} bins at a time.`)
      .refine((ids) => new Set(ids).size === ids.length, 'Each bin at most once.'),
    contents: z.boolean().default(false),
    format: labelFormatSchema.optional(),
    skip: z.number().int().min(0).max(29, 'A sheet has at most 30 labels.').default(0),
  })
  .strict();
export type BinLabelsRequest = z.input<typeof binLabelsRequestSchema>;
export type BinLabelsRequestParsed = z.output<typeof binLabelsRequestSchema>;
