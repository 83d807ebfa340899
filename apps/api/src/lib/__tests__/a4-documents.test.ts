// The four A4 business documents, read back through pdf-lib's parser and the labels tests'
// content-stream reader (not the code that wrote them): everything inside the page, a table that
// runs over a page repeats its column heads, and the figures and links a reader needs are there.
import { describe, expect, it } from 'vitest';
import { PDFDocument } from 'pdf-lib';
import { readLabelPdf, type ParsedPage } from '../../modules/labels/__tests__/read-label-pdf';
import { renderOrderPdf } from '../../modules/purchasing/order-pdf';
import { renderInvoicePdf } from '../../modules/sales/invoice-pdf';
import { renderEstimatePdf } from '../../modules/estimates/estimate-pdf';
import { renderSettlementPdf } from '../../modules/consignment/settlement-pdf';
import { A4Writer, a4 } from '../a4-document';
import { estimateInput, invoiceInput, orderInput, settlementInput } from './pdf-documents.fixture';

const margin = 48;
const textOf = (pages: ParsedPage[]) => pages.flatMap((p) => p.texts.map((t) => t.text));

/** Every run on A4, inside the side margins, above the footer line and below the top margin. */
function expectInsidePage(pages: ParsedPage[]) {
  for (const page of pages) {
    expect([page.width, page.height]).toEqual([a4.width, a4.height]);
    for (const run of page.texts) {
      expect(run.x, run.text).toBeGreaterThanOrEqual(margin - 0.01);
      expect(run.x + run.width, run.text).toBeLessThanOrEqual(a4.width - margin + 0.01);
      expect(run.y, run.text).toBeGreaterThanOrEqual(margin - 10 - 0.01);
      expect(run.y, run.text).toBeLessThanOrEqual(a4.height - margin + 0.01);
    }
  }
}

/** Each page's first line is the table's column heads (from the second page on). */
function expectHeadsOnEveryPage(pages: ParsedPage[], heads: string[]) {
  expect(pages.length).toBeGreaterThan(1);
  for (const page of pages.slice(1)) {
    const top = Math.max(...page.texts.map((t) => t.y));
    expect(page.texts.filter((t) => t.y === top).map((t) => t.text)).toEqual(heads);
  }
}

describe('the A4 business documents', () => {
  it('a long purchase order breaks over pages with its column heads repeated, and ends with the total and the quoting line', async () => {
    const input = orderInput(70);
    const pdf = await renderOrderPdf(input);
    expect((await PDFDocument.load(pdf)).getTitle()).toBe('Purchase order PO-000042');
    const pages = await readLabelPdf(pdf);
    expectInsidePage(pages);
    expectHeadsOnEveryPage(pages, ['Our number', 'Your number', 'Description', 'Qty', 'Unit price', 'Line total']);
    const texts = textOf(pages);
    for (const l of input.lines) expect(texts).toContain(l.partNumber);
    expect(texts.filter((t) => t.startsWith('  includes a refundable core deposit')).length).toBe(7);
    expect(texts).toContain('Total £9,876.54');
    // Typographic dashes and quotes become the plain ones the standard fonts can print.
    expect(texts).toContain('Note: Deliver to the rear gate - "mornings only".');
    expect(texts.at(-1)).toBe('Please quote PO-000042 on the delivery note and invoice.');
  });

  it('an invoice shows both parties’ addresses, the tax per rate, what is paid and due, and the pay link; a credit note has no amount due', async () => {
    const pages = await readLabelPdf(await renderInvoicePdf(invoiceInput(60)));
    expectInsidePage(pages);
    expectHeadsOnEveryPage(pages, ['Description', 'Qty', 'Unit price', 'Tax', 'Net']);
    const texts = textOf(pages);
    for (const s of ['Invoice INV-000007', 'Job 118', 'Unit 4, Gearwheel Yard', '12 Quarry Row', 'Tax at 5% on €1,000.00', 'Tax at 20% on €2,000.00', 'Paid', '-€100.00', 'Due', '€3,350.00', 'Pay by card:']) expect(texts).toContain(s);
    expect(texts).toContain('Brake shoe relining 0 - front axle (less 10%)');

    const credit = textOf(await readLabelPdf(await renderInvoicePdf({ ...invoiceInput(3), title: 'Credit note', creditedMinor: 500, payUrl: null })));
    expect(credit).toContain('Credited');
    expect(credit).not.toContain('Due');
    expect(credit).not.toContain('Pay by card:');
  });

  it('an estimate prints labour in hours, the revision, the approval link with its expiry and the line that it is not an invoice', async () => {
    const pages = await readLabelPdf(await renderEstimatePdf(estimateInput(60)));
    expectInsidePage(pages);
    expectHeadsOnEveryPage(pages, ['Description', 'Qty / hours', 'Unit price', 'Tax', 'Net']);
    const texts = textOf(pages);
    expect(texts).toContain('Date: 2026-11-28   (revision 2)');
    expect(texts).toContain('1.5 h');
    expect(texts).toContain('Total including tax £6,480.00');
    expect(texts).toContain('The link works once and until 2026-12-12.');
    expect(texts.at(-1)).toMatch(/^An estimate, not an invoice\./);
  });

  it('a settlement fits one page with the sale, commission, approved work and payout', async () => {
    const pages = await readLabelPdf(await renderSettlementPdf(settlementInput()));
    expect(pages).toHaveLength(1);
    expectInsidePage(pages);
    const texts = textOf(pages);
    for (const s of ['Sale price', '£18,500.00', 'less Commission, 12.5% of the sale price', '-£2,312.50', '-£580.00', 'Payout to the consignor', '£15,607.50', 'Paid on 2026-11-25 by bank transfer, reference LCW-0091.']) expect(texts).toContain(s);
    // The work line is cut to fit beside its amount.
    expect(texts.find((t) => t.startsWith('less approved work'))).toMatch(/\.\.\.$/);
  });
});

describe('A4Writer', () => {
  it('starts a new page only below the given height, and draws the header there', async () => {
    const w = await A4Writer.create('Test');
    let heads = 0;
    w.text('First', w.margin);
    w.y = 200;
    w.breakBelow(150, () => heads++);
    expect([w.y, heads]).toEqual([200, 0]);
    w.y = 149;
    w.breakBelow(150, () => {
      heads++;
      w.text('Heads', w.margin);
    });
    expect([w.y, heads]).toEqual([a4.height - 48, 1]);
    const pages = await readLabelPdf(await w.save());
    expect(pages.map((p) => p.texts.map((t) => t.text))).toEqual([['First'], ['Heads']]);
  });

  it('right-aligns text to its right edge and prints at most four address lines a side', async () => {
    const w = await A4Writer.create('Test');
    w.right('Total', 500);
    w.down(20);
    w.parties({ label: 'From', name: 'A', address: '1\n2\n3\n4\n5' }, { label: 'To', name: 'B', address: null });
    const [page] = await readLabelPdf(await w.save());
    const total = page!.texts.find((t) => t.text === 'Total')!;
    expect(total.x + total.width).toBeCloseTo(500, 1);
    expect(page!.texts.map((t) => t.text)).toEqual(['Total', 'From', 'To', 'A', 'B', '1', '2', '3', '4']);
  });
});
