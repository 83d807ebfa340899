import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { fitText, printable } from './pdf-text';

/** A4 in points. */
export const a4 = { width: 595.28, height: 841.89 } as const;

const ink = rgb(0.12, 0.11, 0.1);
const ruleGrey = rgb(0.4, 0.4, 0.4);

/** One side of a document's "From / To" block. */
export interface Party {
  label: string;
  name: string;
  /** Up to four lines are printed. */
  address?: string | null;
}

/**
 * A top-down writer for the A4 business documents (purchase order, invoice, credit note, estimate,
 * settlement): pdf-lib's built-in Helvetica, one ink colour, a cursor `y` that moves down the page,
 * and new pages that repeat a table header. The documents differ in their columns and totals, not
 * in how a line of text lands on the page, so that part lives here once.
 */
export class A4Writer {
  readonly width = a4.width;
  readonly height = a4.height;
  /** The baseline of the next line, in points from the bottom of the page. */
  y: number;
  private page: PDFPage;

  private constructor(
    private readonly doc: PDFDocument,
    readonly font: PDFFont,
    readonly bold: PDFFont,
    readonly margin: number,
  ) {
    this.page = doc.addPage([a4.width, a4.height]);
    this.y = a4.height - margin;
  }

  /** A new document with its title (shown by PDF readers) and one empty page. */
  static async create(title: string, margin = 48): Promise<A4Writer> {
    const doc = await PDFDocument.create();
    doc.setTitle(printable(title));
    doc.setCreator('Tappet');
    return new A4Writer(doc, await doc.embedFont(StandardFonts.Helvetica), await doc.embedFont(StandardFonts.HelveticaBold), margin);
  }

  /** The printable width between the margins. */
  get contentWidth(): number {
    return this.width - 2 * this.margin;
  }

  /** Moves the cursor down by `points` (up when negative). */
  down(points: number): void {
    this.y -= points;
  }

  /** Text with its left edge at `x` on the current line. */
  text(s: string, x: number, size = 10, f: PDFFont = this.font): void {
    this.page.drawText(printable(s), { x, y: this.y, size, font: f, color: ink });
  }

  /** Text with its right edge at `xRight` on the current line. */
  right(s: string, xRight: number, size = 10, f: PDFFont = this.font): void {
    const p = printable(s);
    this.page.drawText(p, { x: xRight - f.widthOfTextAtSize(p, size), y: this.y, size, font: f, color: ink });
  }

  /** `s` cut with "..." to fit `maxWidth` points in the regular face. */
  fit(s: string, maxWidth: number, size = 10): string {
    return fitText(this.font, s, maxWidth, size);
  }

  /** A thin rule across the content width at the cursor (or `dy` points above it). */
  rule(dy = 0): void {
    const y = this.y + dy;
    this.page.drawLine({ start: { x: this.margin, y }, end: { x: this.width - this.margin, y }, thickness: 0.5, color: ruleGrey });
  }

  /**
   * Starts a new page when the cursor is below `lowest` points from the bottom edge, and then
   * draws `header` (a table's column heads) at its top.
   */
  breakBelow(lowest: number, header?: () => void): void {
    if (this.y >= lowest) return;
    this.page = this.doc.addPage([a4.width, a4.height]);
    this.y = this.height - this.margin;
    header?.();
  }

  /**
   * A table's column heads in bold, each left-aligned at its `x` or right-aligned at it
   * (`align: 'right'`, for figures), then a rule; returns a function that draws them again (for
   * `breakBelow` on a new page).
   */
  columnHeads(heads: ReadonlyArray<{ label: string; x: number; align?: 'right' }>): () => void {
    const draw = () => {
      for (const h of heads) {
        if (h.align === 'right') this.right(h.label, h.x, 9, this.bold);
        else this.text(h.label, h.x, 9, this.bold);
      }
      this.down(6);
      this.rule();
      this.down(14);
    };
    draw();
    return draw;
  }

  /** The document's title line, then its date line. */
  title(title: string, dateLine: string, aside?: string | null): void {
    this.text(title, this.margin, 18, this.bold);
    this.down(24);
    this.text(dateLine, this.margin);
    if (aside) this.text(aside, this.width / 2);
    this.down(22);
  }

  /** The "From / To" block: labels, names and up to four address lines each, side by side. */
  parties(from: Party, to: Party): void {
    const half = this.width / 2;
    this.text(from.label, this.margin, 9, this.bold);
    this.text(to.label, half, 9, this.bold);
    this.down(14);
    this.text(from.name, this.margin);
    this.text(to.name, half);
    const lines = (a?: string | null) => (a ?? '').split(/\r?\n/).filter(Boolean).slice(0, 4);
    const [left, right] = [lines(from.address), lines(to.address)];
    for (let i = 0; i < Math.max(left.length, right.length); i++) {
      this.down(13);
      if (left[i]) this.text(left[i]!, this.margin);
      if (right[i]) this.text(right[i]!, half);
    }
  }

  /** A small line at the foot of the current page, below the margin. */
  footer(s: string): void {
    this.y = this.margin - 10;
    this.text(s, this.margin, 8);
  }

  /** The finished PDF. */
  async save(): Promise<Buffer> {
    return Buffer.from(await this.doc.save());
  }
}
