import { describe, expect, it } from 'vitest';
import { labelPageCount, labelSheetLayouts, partLabelsRequestSchema } from './labels';

const id = (n: number) => `aaaaaaaa-0000-4000-8000-${String(n).padStart(12, '0')}`;

describe('label sheet layouts', () => {
  it('fit their pages: margins, labels and gaps add up to the page (the bottom margin is what is left)', () => {
    for (const l of Object.values(labelSheetLayouts)) {
      const across = l.marginLeftMm * 2 + l.columns * l.labelWidthMm + (l.columns - 1) * l.gapXMm;
      const down = l.marginTopMm + l.rows * l.labelHeightMm + (l.rows - 1) * l.gapYMm;
      expect(across, l.id).toBeCloseTo(l.pageWidthMm, 6);
      // Symmetric top and bottom margins on every format.
      expect(l.pageHeightMm - down, l.id).toBeCloseTo(l.marginTopMm, 6);
    }
    // The brief's figures: A4 595.28 × 841.89 pt, Letter 612 × 792 pt.
    const pt = (mm: number) => (mm * 72) / 25.4;
    expect(pt(labelSheetLayouts['a4-3x8'].pageWidthMm)).toBeCloseTo(595.28, 2);
    expect(pt(labelSheetLayouts['a4-3x8'].pageHeightMm)).toBeCloseTo(841.89, 2);
    expect(pt(labelSheetLayouts['letter-3x10'].pageWidthMm)).toBeCloseTo(612, 6);
    expect(pt(labelSheetLayouts['letter-3x10'].pageHeightMm)).toBeCloseTo(792, 6);
  });

  it('counts pages, including the used positions of a first sheet', () => {
    expect(labelPageCount('a4-3x8', 24)).toBe(1);
    expect(labelPageCount('a4-3x8', 25)).toBe(2);
    expect(labelPageCount('a4-3x8', 5, 20)).toBe(2);
    expect(labelPageCount('letter-3x10', 30)).toBe(1);
    expect(labelPageCount('roll-62x29', 3)).toBe(3);
  });

  it('limits a request to 600 labels', () => {
    expect(partLabelsRequestSchema.safeParse({ partIds: Array.from({ length: 12 }, (_, i) => id(i)), copies: 50 }).success).toBe(true);
    const over = partLabelsRequestSchema.safeParse({ partIds: Array.from({ length: 13 }, (_, i) => id(i)), copies: 50 });
    expect(over.success).toBe(false);
    expect(over.error?.issues[0]?.message).toBe('Print at most 600 labels at a time.');
  });
});
