import { PDFDocument, StandardFonts } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import { fitText, printable } from '../pdf-text';

describe('text for the standard PDF fonts', () => {
  it('keeps Latin-1 and the euro sign, plain-forms typography, and marks the rest', () => {
    expect(printable('‘Kit’ – “rebuild” … 3×4 — 12\u00a0mm, £5 or €6, Müller, ✓ 漢')).toBe(`'Kit' - "rebuild" ... 3x4 - 12 mm, £5 or €6, Müller, ? ?`);
  });

  it('cuts text to a width with "..." and leaves text that fits alone', async () => {
    const font = await (await PDFDocument.create()).embedFont(StandardFonts.Helvetica);
    expect(fitText(font, 'Gasket', 200)).toBe('Gasket');
    const cut = fitText(font, 'Carburettor float bowl gasket, reproduction, pair', 80);
    expect(cut.endsWith('...')).toBe(true);
    expect(font.widthOfTextAtSize(cut, 10)).toBeLessThanOrEqual(80);
    expect('Carburettor float bowl gasket, reproduction, pair'.startsWith(cut.slice(0, -3))).toBe(true);
    // Embedding the result never throws for characters outside WinAnsi.
    expect(() => font.encodeText(fitText(font, 'Ölwanne ✓ – 漢字', 500))).not.toThrow();
  });
});
