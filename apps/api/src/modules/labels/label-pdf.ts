import {
  PDFDocument,
  StandardFonts,
  beginMarkedContent,
  endMarkedContent,
  fill,
  popGraphicsState,
  pushGraphicsState,
  rectangle,
  rgb,
  setFillingGrayscaleColor,
  type PDFFont,
  type PDFPage,
} from 'pdf-lib';
import { labelSheetLayouts, type LabelFormat, type LabelSheetLayout } from '@tappet/contracts';
import { code128, qrCode, type LinearSymbol, type MatrixSymbol } from './barcodes';

/**
 * One label, whatever it is for. `code` is what the barcodes carry and what is printed largest
 * (a part number, a bin code); `title` is the short description, `subtitle` a third line such as
 * the bin. Part labels and bin labels are the same code with different words.
 */
export interface LabelItem {
  code: string;
  title: string;
  subtitle: string;
}

/** Points per millimetre (1 pt = 1/72 in). */
export const ptPerMm = 72 / 25.4;

/** Marked-content tags around each symbol, so a reader (and our tests) can find them. */
export const code128Tag = 'TappetCode128';
export const qrTag = 'TappetQR';

/** Code 128 needs 10 modules of clear space either side (ISO/IEC 15417, from memory). */
const code128QuietModules = 10;
/**
 * The QR specification asks for 4 modules of clear space; on a small label we keep 2 inside the
 * symbol's box and the label padding (and the neighbour's padding on gapless sheets) adds more.
 */
const qrQuietModules = 2;
/** Wider modules than this add nothing but size. */
const maxModuleMm = 0.5;

interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** A line of text as placed: `x`, `baseline` in mm from the label's top-left; `width` measured. */
export interface PlacedText {
  text: string;
  font: 'mono' | 'text' | 'bold';
  size: number;
  x: number;
  baseline: number;
  width: number;
}

/** Where everything on one label goes, in mm from the label's top-left corner. */
export interface LabelLayout {
  texts: PlacedText[];
  /** Code 128 bars (x, width) and their common top and height. */
  bars: { x: number; width: number }[];
  barsTop: number;
  barsHeight: number;
  /** QR box (including its quiet zone), its module size and the symbol. */
  qr: Box & { module: number; symbol: MatrixSymbol };
}

/** The two symbols of one code (encoding a QR code takes milliseconds: share them between copies). */
export interface LabelSymbols {
  linear: LinearSymbol;
  qr: MatrixSymbol;
}

/** Encodes both symbols of `code`. */
export const symbolsFor = (code: string): LabelSymbols => ({ linear: code128(code), qr: qrCode(code) });

interface Fonts {
  mono: PDFFont;
  text: PDFFont;
  bold: PDFFont;
}

/** Replaces characters the standard fonts cannot encode (WinAnsi) with "?", and collapses spaces. */
function encodable(font: PDFFont, text: string): string {
  const set = charSets.get(font) ?? new Set(font.getCharacterSet());
  charSets.set(font, set);
  return Array.from(text.replace(/\s+/g, ' ').trim(), (ch) => (set.has(ch.codePointAt(0) ?? 0) ? ch : '?')).join('');
}
const charSets = new WeakMap<PDFFont, Set<number>>();

const ptToMm = (pt: number) => pt / ptPerMm;
const widthMm = (font: PDFFont, text: string, size: number) => ptToMm(font.widthOfTextAtSize(text, size));

/** The longest prefix of `text` that fits `maxMm` with an ellipsis (the whole text if it fits). */
export function truncateToWidth(font: PDFFont, text: string, size: number, maxMm: number): string {
  if (widthMm(font, text, size) <= maxMm) return text;
  let lo = 0;
  let hi = text.length;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (widthMm(font, `${text.slice(0, mid).trimEnd()}…`, size) <= maxMm) lo = mid;
    else hi = mid - 1;
  }
  return lo === 0 ? '' : `${text.slice(0, lo).trimEnd()}…`;
}

/** Word-wraps into at most `maxLines` lines of `maxMm`; the last line is truncated if text remains. */
export function wrapToWidth(font: PDFFont, text: string, size: number, maxMm: number, maxLines: number): string[] {
  const words = text.split(' ').filter(Boolean);
  const lines: string[] = [];
  let i = 0;
  while (i < words.length && lines.length < maxLines) {
    if (lines.length === maxLines - 1) {
      lines.push(truncateToWidth(font, words.slice(i).join(' '), size, maxMm));
      break;
    }
    let line = words[i] ?? '';
    // A single word wider than the line is cut, rather than left to overflow.
    if (widthMm(font, line, size) > maxMm) {
      lines.push(truncateToWidth(font, line, size, maxMm));
      i += 1;
      continue;
    }
    i += 1;
    while (i < words.length && widthMm(font, `${line} ${words[i]}`, size) <= maxMm) {
      line = `${line} ${words[i]}`;
      i += 1;
    }
    lines.push(line);
  }
  return lines.filter((l) => l.length > 0);
}

/**
 * Lays out one label of `width` × `height` mm: the code large in a monospaced face, up to two
 * lines of description, the subtitle, the Code 128 symbol across the bottom of the text column
 * and the QR code on the right. Nothing is placed outside the label's padding.
 */
export function layoutLabel(item: LabelItem, width: number, height: number, fonts: Fonts, symbols: LabelSymbols = symbolsFor(item.code)): LabelLayout {
  const pad = Math.min(2.5, Math.max(1.5, height * 0.07));
  const innerW = width - 2 * pad;
  const innerH = height - 2 * pad;
  const gap = 2;
  const large = height >= 35;

  // QR on the right, as tall as the label allows, vertically centred.
  const qrSymbol = symbols.qr;
  const qrSide = Math.min(innerH, innerW * 0.36);
  const qrModule = qrSide / (qrSymbol.size + 2 * qrQuietModules);
  const qr = { x: width - pad - qrSide, y: (height - qrSide) / 2, width: qrSide, height: qrSide, module: qrModule, symbol: qrSymbol };

  const columnX = pad;
  const columnW = qr.x - gap - columnX;
  const texts: PlacedText[] = [];
  let cursor = pad;
  const place = (text: string, font: keyof Fonts, size: number) => {
    const line = text;
    if (!line) return;
    cursor += ptToMm(fonts[font].heightAtSize(size, { descender: false }));
    texts.push({ text: line, font, size, x: columnX, baseline: cursor, width: widthMm(fonts[font], line, size) });
    cursor += ptToMm(size) * 0.35;
  };

  // The code: shrink to fit down to 7 pt, then truncate (the symbols still carry all of it).
  const code = encodable(fonts.mono, item.code);
  let codeSize = large ? 13 : 11;
  while (codeSize > 7 && widthMm(fonts.mono, code, codeSize) > columnW) codeSize -= 0.5;
  place(truncateToWidth(fonts.mono, code, codeSize, columnW), 'mono', codeSize);
  cursor += 0.6;

  const textSize = large ? 8 : 6.5;
  for (const line of wrapToWidth(fonts.text, encodable(fonts.text, item.title), textSize, columnW, 2)) place(line, 'text', textSize);
  place(truncateToWidth(fonts.bold, encodable(fonts.bold, item.subtitle), textSize, columnW), 'bold', textSize);

  // Code 128 in what is left of the column, quiet zones inside the label (left edge to the QR).
  const linear = symbols.linear;
  const module = Math.min(maxModuleMm, qr.x / (linear.modules + 2 * code128QuietModules));
  const barsX = Math.max(pad, code128QuietModules * module);
  const barsTop = cursor + 1;
  const barsHeight = Math.max(3, Math.min(12, height - pad - barsTop));
  const bars: { x: number; width: number }[] = [];
  let x = barsX;
  linear.widths.forEach((w, i) => {
    if (i % 2 === 0) bars.push({ x, width: w * module });
    x += w * module;
  });
  return { texts, bars, barsTop: height - pad - barsHeight, barsHeight, qr };
}

/** Top-left corner (mm, from the page's top-left) of label position `index` on a page. */
export function cellOrigin(layout: LabelSheetLayout, index: number): { x: number; y: number } {
  const column = index % layout.columns;
  const row = Math.floor(index / layout.columns);
  return { x: layout.marginLeftMm + column * (layout.labelWidthMm + layout.gapXMm), y: layout.marginTopMm + row * (layout.labelHeightMm + layout.gapYMm) };
}

function drawLabel(page: PDFPage, fonts: Fonts, item: LabelItem, symbols: LabelSymbols, layout: LabelSheetLayout, origin: { x: number; y: number }) {
  const pageH = layout.pageHeightMm;
  const placed = layoutLabel(item, layout.labelWidthMm, layout.labelHeightMm, fonts, symbols);
  // PDF space: points from the bottom-left.
  const px = (mmX: number) => (origin.x + mmX) * ptPerMm;
  const py = (mmYFromTop: number) => (pageH - origin.y - mmYFromTop) * ptPerMm;

  for (const t of placed.texts) {
    page.drawText(t.text, { x: px(t.x), y: py(t.baseline), size: t.size, font: fonts[t.font], color: rgb(0, 0, 0) });
  }

  page.pushOperators(pushGraphicsState(), setFillingGrayscaleColor(0), beginMarkedContent(code128Tag));
  for (const bar of placed.bars) {
    page.pushOperators(rectangle(px(bar.x), py(placed.barsTop + placed.barsHeight), bar.width * ptPerMm, placed.barsHeight * ptPerMm));
  }
  page.pushOperators(fill(), endMarkedContent());

  const { qr } = placed;
  const { symbol } = qr;
  page.pushOperators(beginMarkedContent(qrTag));
  const m = qr.module;
  for (let row = 0; row < symbol.size; row += 1) {
    // Runs of dark modules in a row become one rectangle: a smaller file, the same picture.
    let col = 0;
    while (col < symbol.size) {
      if (!symbol.dark[row * symbol.size + col]) {
        col += 1;
        continue;
      }
      const start = col;
      while (col < symbol.size && symbol.dark[row * symbol.size + col]) col += 1;
      const left = qr.x + (qrQuietModules + start) * m;
      const top = qr.y + (qrQuietModules + row) * m;
      page.pushOperators(rectangle(px(left), py(top + m), (col - start) * m * ptPerMm, m * ptPerMm));
    }
  }
  page.pushOperators(fill(), endMarkedContent(), popGraphicsState());
}

/**
 * Renders labels onto pages of `format`, in order, starting after `skip` used positions on the
 * first sheet (ignored on rolls, where every label is a page of its own). Returns the PDF bytes.
 */
export async function renderLabelPdf(items: LabelItem[], format: LabelFormat, options: { skip?: number; title?: string } = {}): Promise<Uint8Array> {
  const layout = labelSheetLayouts[format];
  const perPage = layout.columns * layout.rows;
  const skip = perPage === 1 ? 0 : Math.min(options.skip ?? 0, perPage - 1);
  const doc = await PDFDocument.create();
  doc.setTitle(options.title ?? 'Labels');
  doc.setCreator('Tappet');
  doc.setProducer('Tappet');
  // Fixed dates: the same labels give the same bytes.
  doc.setCreationDate(new Date(0));
  doc.setModificationDate(new Date(0));
  const fonts: Fonts = {
    mono: await doc.embedFont(StandardFonts.CourierBold),
    text: await doc.embedFont(StandardFonts.Helvetica),
    bold: await doc.embedFont(StandardFonts.HelveticaBold),
  };
  let page: PDFPage | null = null;
  const symbolCache = new Map<string, LabelSymbols>();
  for (const [i, item] of items.entries()) {
    const position = (i + skip) % perPage;
    if (!page || position === 0) page = doc.addPage([layout.pageWidthMm * ptPerMm, layout.pageHeightMm * ptPerMm]);
    let symbols = symbolCache.get(item.code);
    if (!symbols) {
      symbols = symbolsFor(item.code);
      symbolCache.set(item.code, symbols);
      // Encoding is synchronous work of a few milliseconds a code: let other requests in between.
      await new Promise((resolve) => setImmediate(resolve));
    }
    drawLabel(page, fonts, item, symbols, layout, cellOrigin(layout, position));
  }
  if (items.length === 0) doc.addPage([layout.pageWidthMm * ptPerMm, layout.pageHeightMm * ptPerMm]);
  return doc.save();
}
