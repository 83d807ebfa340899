import { describe, expect, it } from 'vitest';
import { renderLabelPdf, type LabelItem } from '../label-pdf';
import { boundsOf, decodeCode128, decodeQr, readLabelPdf, type ParsedPage, type Rect } from './read-label-pdf';

const mm = 72 / 25.4;

// The sheet layouts written out by hand (see labelSheetLayouts for where the figures come from),
// so that a wrong constant in the code shows up here: cell top-left corner in mm from the top-left.
const expectedCells = {
  'a4-3x8': { page: [595.28, 841.89], perPage: 24, w: 70, h: 37, cell: (c: number, r: number) => [c * 70, 0.5 + r * 37] },
  'letter-3x10': { page: [612, 792], perPage: 30, w: 66.675, h: 25.4, cell: (c: number, r: number) => [4.7625 + c * (66.675 + 3.175), 12.7 + r * 25.4] },
  'roll-62x29': { page: [62 * mm, 29 * mm], perPage: 1, w: 62, h: 29, cell: () => [0, 0] },
} as const;
type Format = keyof typeof expectedCells;

const item = (i: number): LabelItem => ({ code: `HW-${String(1000 + i)}-B`, title: `Gearbox mainshaft bearing, reproduction, batch ${i}`, subtitle: `Bin A-${String(i % 12).padStart(2, '0')}` });

/** The cell of label `index` on its page, in PDF points (origin bottom-left). */
function cellRect(format: Format, pageHeight: number, index: number): Rect {
  const spec = expectedCells[format];
  const columns = format === 'a4-3x8' || format === 'letter-3x10' ? 3 : 1;
  const [x = NaN, top = NaN] = spec.cell(index % columns, Math.floor(index / columns));
  return { x: x * mm, y: pageHeight - (top + spec.h) * mm, width: spec.w * mm, height: spec.h * mm };
}

/** True when `inner` lies inside `outer` shrunk by `inset` points on every side. */
const inside = (inner: Rect, outer: Rect, inset: number) =>
  inner.x >= outer.x + inset - 1e-6 && inner.y >= outer.y + inset - 1e-6 && inner.x + inner.width <= outer.x + outer.width - inset + 1e-6 && inner.y + inner.height <= outer.y + outer.height - inset + 1e-6;

/** Groups a page's symbols and text runs by the cell they sit in. */
function labelsOn(page: ParsedPage, format: Format, count: number) {
  return Array.from({ length: count }, (_, i) => {
    const cell = cellRect(format, page.height, i);
    const within = (r: Rect) => inside(r, cell, 0);
    return {
      cell,
      code128: page.symbols.filter((s) => s.tag === 'TappetCode128' && within(boundsOf(s.rects))),
      qr: page.symbols.filter((s) => s.tag === 'TappetQR' && within(boundsOf(s.rects))),
      texts: page.texts.filter((t) => within({ x: t.x, y: t.y, width: t.width, height: t.size * 0.7 })),
    };
  });
}

describe('label sheets', () => {
  for (const [format, count, pages] of [
    ['a4-3x8', 26, 2],
    ['letter-3x10', 31, 2],
    ['roll-62x29', 3, 3],
  ] as const) {
    it(`${format}: page size, label cells, and every symbol decodes to its code`, async () => {
      const items = Array.from({ length: count }, (_, i) => item(i));
      const parsed = await readLabelPdf(await renderLabelPdf(items, format));
      const spec = expectedCells[format];
      expect(parsed).toHaveLength(pages);
      let n = 0;
      for (const page of parsed) {
        expect(page.width).toBeCloseTo(spec.page[0], 1);
        expect(page.height).toBeCloseTo(spec.page[1], 1);
        const onPage = Math.min(spec.perPage, count - n);
        // Exactly one Code 128 and one QR per label, nothing drawn outside the cells.
        expect(page.symbols).toHaveLength(2 * onPage);
        for (const label of labelsOn(page, format, onPage)) {
          const expected = items[n];
          n += 1;
          expect(label.code128, `label ${n}`).toHaveLength(1);
          expect(label.qr, `label ${n}`).toHaveLength(1);
          expect(decodeCode128(label.code128[0]!.rects)).toBe(expected!.code);
          expect(decodeQr(label.qr[0]!.rects)).toBe(expected!.code);
          // The number, description and bin are printed, inside the label's padding (1.5 mm).
          const words = label.texts.map((t) => t.text).join(' ');
          expect(words).toContain(expected!.code);
          expect(words).toContain('Gearbox');
          expect(words).toContain(expected!.subtitle);
          for (const t of label.texts) expect(inside({ x: t.x, y: t.y, width: t.width, height: t.size * 0.7 }, label.cell, 1.5 * mm), t.text).toBe(true);
          for (const s of [...label.code128, ...label.qr]) expect(inside(boundsOf(s.rects), label.cell, 1.5 * mm)).toBe(true);
        }
      }
      expect(n).toBe(count);
    });
  }

  it('cuts long descriptions and numbers to fit, with an ellipsis, never past the label', async () => {
    const long: LabelItem = {
      code: 'HW-1234567890-ABCDEFGHIJKLMNOPQRSTUVWXYZ',
      title: `${'Exhaust header clamp with stainless bolts and spring washers '.repeat(4)}Supercalifragilisticexpialidociousandevenlongerwordthatcannotwrap`,
      subtitle: 'Bins A-01, A-02, B-17, C-03, Back store shelf 14, Mezzanine rack 9',
    };
    for (const format of ['a4-3x8', 'letter-3x10', 'roll-62x29'] as const) {
      const pages = await readLabelPdf(await renderLabelPdf([long, { code: 'X', title: 'Supercalifragilisticexpialidociousandevenlongerwordthatcannotwrapatall', subtitle: '' }], format));
      // On a roll each label is a page of its own.
      const labels = format === 'roll-62x29' ? pages.flatMap((p) => labelsOn(p, format, 1)) : labelsOn(pages[0]!, format, 2);
      const page = { texts: pages.flatMap((p) => p.texts) };
      expect(labels).toHaveLength(2);
      // Every text run of the page belongs to some label and stays inside its padding.
      expect(labels.reduce((k, l) => k + l.texts.length, 0)).toBe(page.texts.length);
      for (const label of labels) {
        for (const t of label.texts) expect(t.x + t.width, `${format}: ${t.text}`).toBeLessThanOrEqual(label.cell.x + label.cell.width - 1.5 * mm);
      }
      const first = labels[0]!.texts.map((t) => t.text);
      // Number (cut), two lines of description (the second cut), the bins (cut).
      expect(first).toHaveLength(4);
      expect(first[0]).toMatch(/^HW-1234567890-.*…$/);
      expect(first[1]).toMatch(/^Exhaust header/);
      expect(first[2]).toMatch(/…$/);
      expect(first[3]).toMatch(/^Bins A-01, .*…$/);
      // A single word wider than the label is cut too.
      expect(labels[1]!.texts.map((t) => t.text).at(-1)).toMatch(/^Supercalifragilistic.*…$/);
      // The symbols still carry the whole number.
      expect(decodeQr(labels[0]!.qr[0]!.rects)).toBe(long.code);
    }
  });

  it('starts after the used positions of a partly used sheet', async () => {
    const [page] = await readLabelPdf(await renderLabelPdf([item(1), item(2)], 'a4-3x8', { skip: 5 }));
    const labels = labelsOn(page!, 'a4-3x8', 8);
    expect(labels.slice(0, 5).every((l) => l.qr.length === 0)).toBe(true);
    expect(decodeQr(labels[5]!.qr[0]!.rects)).toBe(item(1).code);
    expect(decodeQr(labels[6]!.qr[0]!.rects)).toBe(item(2).code);
  });

  it('prints characters the PDF fonts lack as "?" instead of failing', async () => {
    const [page] = await readLabelPdf(await renderLabelPdf([{ code: 'HW-7', title: 'Ölkühler → Ø 12 mm 日本', subtitle: '' }], 'roll-62x29'));
    expect(page!.texts.map((t) => t.text)).toContain('Ölkühler ? Ø 12 mm ??');
  });
});
