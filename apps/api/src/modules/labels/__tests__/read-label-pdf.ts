// Reads a label PDF back for tests, without the code that wrote it: page sizes through pdf-lib's
// parser, the content streams tokenised here, the symbols' rectangles rasterised here and decoded
// by @zxing/library (an independent implementation of Code 128 and QR).
import { PDFArray, PDFDict, PDFDocument, PDFName, PDFRawStream, PDFRef, StandardFonts, decodePDFRawStream, type PDFFont } from 'pdf-lib';
import { BarcodeFormat, BinaryBitmap, Code128Reader, DecodeHintType, HybridBinarizer, QRCodeReader, RGBLuminanceSource } from '@zxing/library';

export interface Rect {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface TextRun {
  text: string;
  fontName: string;
  size: number;
  x: number;
  y: number;
  /** Advance width in points, measured with the standard font's metrics. */
  width: number;
}

export interface ParsedPage {
  width: number;
  height: number;
  /** Rectangles inside each marked-content block, by tag, one array per block. */
  symbols: { tag: string; rects: Rect[] }[];
  texts: TextRun[];
}

const tokenPattern = /<[0-9A-Fa-f]*>|\/[^\s/[\]<>()]+|\[|\]|[A-Za-z'"*]+|[-+]?(?:\d+\.?\d*|\.\d+)/g;

function streamBytes(doc: PDFDocument, ref: unknown): Uint8Array {
  const obj = ref instanceof PDFRef ? doc.context.lookup(ref) : ref;
  if (obj instanceof PDFRawStream) return decodePDFRawStream(obj).decode();
  throw new Error('Content stream of an unexpected kind.');
}

// WinAnsi differs from Latin-1 in 0x80–0x9F; these are the ones labels can contain.
const winAnsiHigh: Record<number, string> = { 0x80: '€', 0x85: '…', 0x91: '‘', 0x92: '’', 0x93: '“', 0x94: '”', 0x96: '–', 0x97: '—' };

const standardFonts = Object.values(StandardFonts) as string[];

/** Parses every page of a PDF into its size, marked symbols and text runs. */
export async function readLabelPdf(bytes: Uint8Array): Promise<ParsedPage[]> {
  const doc = await PDFDocument.load(bytes);
  const measure = await PDFDocument.create();
  const fontCache = new Map<string, PDFFont>();
  const fontFor = async (baseFont: string) => {
    if (!standardFonts.includes(baseFont)) throw new Error(`Unexpected font ${baseFont}`);
    const cached = fontCache.get(baseFont) ?? (await measure.embedFont(baseFont as StandardFonts));
    fontCache.set(baseFont, cached);
    return cached;
  };
  const pages: ParsedPage[] = [];
  for (const page of doc.getPages()) {
    const { width, height } = page.getSize();
    const fontDict = page.node.Resources()?.lookup(PDFName.of('Font'), PDFDict);
    const baseFontOf = (resource: string) => {
      const dict = fontDict?.lookup(PDFName.of(resource.slice(1)), PDFDict);
      const base = dict?.get(PDFName.of('BaseFont'));
      return base ? base.toString().slice(1) : '';
    };
    const contents = page.node.Contents();
    const streams = contents instanceof PDFArray ? contents.asArray() : [contents];
    const source = streams.map((s) => new TextDecoder('latin1').decode(streamBytes(doc, s))).join('\n');
    const tokens = source.match(tokenPattern) ?? [];

    const symbols: ParsedPage['symbols'] = [];
    const texts: TextRun[] = [];
    let operands: string[] = [];
    let current: { tag: string; rects: Rect[] } | null = null;
    let font = { name: '', size: 0 };
    let textAt = { x: 0, y: 0 };
    for (const token of tokens) {
      if (!/^[A-Za-z'"*]+$/.test(token)) {
        operands.push(token);
        continue;
      }
      const n = (i: number) => Number(operands[operands.length - i]);
      switch (token) {
        case 'BMC':
          current = { tag: (operands[operands.length - 1] ?? '').slice(1), rects: [] };
          symbols.push(current);
          break;
        case 'EMC':
          current = null;
          break;
        case 're':
          if (current) current.rects.push({ x: n(4), y: n(3), width: n(2), height: n(1) });
          break;
        case 'Tf':
          font = { name: baseFontOf(operands[operands.length - 2] ?? ''), size: n(1) };
          break;
        case 'Tm':
          textAt = { x: n(2), y: n(1) };
          break;
        case 'Tj': {
          const hex = (operands[operands.length - 1] ?? '<>').slice(1, -1);
          const bytes = Uint8Array.from(hex.match(/../g) ?? [], (h) => parseInt(h, 16));
          const text = Array.from(bytes, (b) => winAnsiHigh[b] ?? String.fromCharCode(b)).join('');
          const f = await fontFor(font.name);
          texts.push({ text, fontName: font.name, size: font.size, x: textAt.x, y: textAt.y, width: f.widthOfTextAtSize(text, font.size) });
          break;
        }
        default:
          break;
      }
      operands = [];
    }
    pages.push({ width, height, symbols, texts });
  }
  return pages;
}

/** The bounding box of some rectangles. */
export function boundsOf(rects: Rect[]): Rect {
  const x = Math.min(...rects.map((r) => r.x));
  const y = Math.min(...rects.map((r) => r.y));
  return { x, y, width: Math.max(...rects.map((r) => r.x + r.width)) - x, height: Math.max(...rects.map((r) => r.y + r.height)) - y };
}

/**
 * Paints black rectangles on white at `pxPerPt`, with a white margin of `marginPt` around their
 * bounds (the quiet zone a scanner needs), as 8-bit luminance rows (top row first).
 */
export function rasterise(rects: Rect[], pxPerPt: number, marginPt: number) {
  const box = boundsOf(rects);
  const width = Math.ceil((box.width + 2 * marginPt) * pxPerPt);
  const height = Math.ceil((box.height + 2 * marginPt) * pxPerPt);
  const pixels = new Uint8ClampedArray(width * height).fill(255);
  for (const r of rects) {
    const x0 = Math.round((r.x - box.x + marginPt) * pxPerPt);
    const x1 = Math.round((r.x + r.width - box.x + marginPt) * pxPerPt);
    // PDF y grows upwards; image rows grow downwards.
    const y0 = Math.round((box.y + box.height - (r.y + r.height) + marginPt) * pxPerPt);
    const y1 = Math.round((box.y + box.height - r.y + marginPt) * pxPerPt);
    for (let y = Math.max(0, y0); y < Math.min(height, y1); y += 1) pixels.fill(0, y * width + Math.max(0, x0), y * width + Math.min(width, x1));
  }
  return { pixels, width, height };
}

/** Decodes a Code 128 symbol drawn as rectangles. */
export function decodeCode128(rects: Rect[]): string {
  const narrowest = Math.min(...rects.map((r) => r.width));
  // Four pixels to the narrowest bar, ten modules of quiet zone.
  const image = rasterise(rects, 4 / narrowest, narrowest * 10);
  const bitmap = new BinaryBitmap(new HybridBinarizer(new RGBLuminanceSource(image.pixels, image.width, image.height)));
  const hints = new Map<DecodeHintType, unknown>([[DecodeHintType.TRY_HARDER, true]]);
  const result = new Code128Reader().decode(bitmap, hints);
  if (result.getBarcodeFormat() !== BarcodeFormat.CODE_128) throw new Error('Not Code 128');
  return result.getText();
}

/** Decodes a QR symbol drawn as rectangles (runs of dark modules). */
export function decodeQr(rects: Rect[]): string {
  const module = Math.min(...rects.map((r) => r.height));
  const image = rasterise(rects, 8 / module, module * 4);
  const bitmap = new BinaryBitmap(new HybridBinarizer(new RGBLuminanceSource(image.pixels, image.width, image.height)));
  return new QRCodeReader().decode(bitmap, new Map([[DecodeHintType.TRY_HARDER, true]])).getText();
}
