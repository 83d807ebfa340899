import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from 'pdf-lib';
import { itemResultWords, jobStatusWords, type Checklist, type ItemRecord, type JobDetail } from '@tappet/contracts';
import { cautionTexts, compressionForDisplay, formatMeasurement, formatMoney, safetyDeferral, type CautionId, type PressureUnit } from '@tappet/domain';
import { printable } from '../../lib/pdf-text';

/** What the printed job sheet needs besides the job itself. */
export interface JobSheetInput {
  job: JobDetail;
  shopName: string;
  /** The shop's pressure unit: compression is printed in it. */
  pressureUnit: PressureUnit;
  printedAt: Date;
}

/** The line every job sheet ends with: Tappet records, it does not certify. */
export const jobSheetDisclaimer = 'Tappet defers to local regulations and licensed practice and does not state that this vehicle is roadworthy.';

type Item = Checklist['items'][number];

/** Readings on record for an item, in one line, compression in the shop's unit. */
export function readingsLine(item: Item, record: ItemRecord, unit: PressureUnit): string {
  const parts: string[] = [];
  if (record.value !== null && item.unit) parts.push(`${record.value} ${item.unit}`);
  if (record.compressionKPa) {
    parts.push(record.compressionKPa.map((v, i) => `#${i + 1} ${formatMeasurement(compressionForDisplay(v, unit), unit)}`).join(', '));
    if (record.compressionSpreadPercent !== null) parts.push(`spread ${record.compressionSpreadPercent.toFixed(1)} %`);
  }
  if (record.tyres) {
    parts.push(record.tyres.map((t) => `${t.position} ${t.code}: ${t.pre2000 ? 'made before 2000' : t.ageYears !== null ? `${t.ageYears.toFixed(1)} years` : 'unreadable'}`).join('; '));
  }
  return parts.join(' / ');
}

const ink = rgb(0.12, 0.11, 0.1);
const grey = rgb(0.4, 0.4, 0.4);
const alarm = rgb(0.65, 0.1, 0.05);

/**
 * Renders a job as an A4 job sheet (pdf-lib, the standard Helvetica faces like the purchase
 * order): vehicle, request, people, every checklist item with its result, readings and note,
 * safety items left unresolved under the owner's sign-off (with the reason and how the customer
 * was told), parts, labour and the job's cost, the cautions of the items on it, and the line
 * deferring to local regulations.
 */
export async function renderJobSheetPdf(input: JobSheetInput): Promise<Buffer> {
  const { job, pressureUnit } = input;
  const doc = await PDFDocument.create();
  doc.setTitle(`Job sheet ${job.number}: ${printable(job.title)}`);
  doc.setCreator('Tappet');
  const font = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  const money = (minor: number) => printable(formatMoney(minor, job.cost.currency));
  const [width, height] = [595.28, 841.89];
  const margin = 44;
  const contentWidth = width - 2 * margin;
  let page: PDFPage = doc.addPage([width, height]);
  let y = height - margin;

  const newPageIfBelow = (needed: number) => {
    if (y - needed < margin + 20) {
      page = doc.addPage([width, height]);
      y = height - margin;
    }
  };
  const text = (s: string, x: number, size = 9.5, f: PDFFont = font, color = ink) => page.drawText(printable(s), { x, y, size, font: f, color });
  const right = (s: string, xRight: number, size = 9.5, f: PDFFont = font) => {
    const p = printable(s);
    page.drawText(p, { x: xRight - f.widthOfTextAtSize(p, size), y, size, font: f, color: ink });
  };
  /** Splits text into lines no wider than `max`, breaking at spaces (or inside a word too long for a line). */
  const wrap = (s: string, max: number, size = 9.5, f: PDFFont = font): string[] => {
    const lines: string[] = [];
    for (const paragraph of printable(s).split(/\r?\n/)) {
      let line = '';
      for (const word of paragraph.split(/\s+/).filter(Boolean)) {
        let w = word;
        while (f.widthOfTextAtSize(w, size) > max) {
          let cut = w.length - 1;
          while (cut > 1 && f.widthOfTextAtSize(w.slice(0, cut), size) > max) cut--;
          if (line) lines.push(line);
          lines.push(w.slice(0, cut));
          line = '';
          w = w.slice(cut);
        }
        const next = line ? `${line} ${w}` : w;
        if (f.widthOfTextAtSize(next, size) > max) {
          lines.push(line);
          line = w;
        } else line = next;
      }
      lines.push(line);
    }
    return lines;
  };
  /** Writes wrapped text at `x`, moving down a line per line. */
  const para = (s: string, x: number, size = 9.5, f: PDFFont = font, color = ink, lineGap = 12) => {
    for (const line of wrap(s, width - margin - x, size, f)) {
      newPageIfBelow(lineGap);
      text(line, x, size, f, color);
      y -= lineGap;
    }
  };
  const heading = (s: string) => {
    newPageIfBelow(40);
    y -= 8;
    text(s, margin, 12, bold);
    y -= 5;
    page.drawLine({ start: { x: margin, y }, end: { x: width - margin, y }, thickness: 0.5, color: grey });
    y -= 13;
  };
  const fact = (label: string, value: string) => {
    newPageIfBelow(14);
    text(label, margin, 9, bold);
    const lines = wrap(value || '-', contentWidth - 110);
    for (const line of lines) {
      newPageIfBelow(12);
      text(line, margin + 110);
      y -= 12;
    }
  };

  // ── Header ──
  text(`Job sheet: job ${job.number}`, margin, 18, bold);
  right(input.shopName, width - margin, 10, bold);
  y -= 20;
  para(job.title, margin, 12, bold, ink, 15);
  text(`Printed ${input.printedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`, margin, 8.5, font, grey);
  y -= 18;

  const v = job.vehicle;
  fact('Vehicle', [v.year, v.marque, v.model].filter((x) => x !== null && x !== '').join(' ') + (v.frameNumber ? `, frame ${v.frameNumber}` : ''));
  fact('Status', jobStatusWords[job.status]);
  fact('Customer request', job.customerRequest);
  fact('Assigned to', job.assignees.map((a) => a.name).join(', ') || 'Nobody');
  fact('Dates', [`opened ${job.createdAt.slice(0, 10)}`, job.dueOn ? `due ${job.dueOn}` : null, job.startedAt ? `started ${job.startedAt.slice(0, 10)}` : null, job.completedAt ? `done ${job.completedAt.slice(0, 10)}` : null].filter(Boolean).join(', '));
  if (job.notes) fact('Notes', job.notes);

  // ── Checklists ──
  const cautions = new Set<CautionId>();
  for (const c of job.checklists) {
    heading(`Checklist: ${c.name}`);
    para(c.completedAt ? `Completed by ${c.completedBy?.name ?? 'someone'} on ${c.completedAt.slice(0, 10)}.` : `Not completed: ${Object.keys(c.records).length} of ${c.items.length} items recorded.`, margin, 9, font, grey);
    y -= 2;
    let section = '';
    for (const item of c.items) {
      for (const id of item.cautions) cautions.add(id);
      if (item.section !== section) {
        section = item.section;
        newPageIfBelow(30);
        y -= 3;
        text(section, margin, 10, bold);
        y -= 13;
      }
      const record = c.records[item.key];
      const signOff = job.signOffs.find((s) => s.checklistId === c.id && s.itemKey === item.key);
      const blocker = job.blockers.find((b) => b.checklistId === c.id && b.key === item.key);
      const resultWord = record ? itemResultWords[record.result] : 'Not recorded';
      newPageIfBelow(14);
      const labelLines = wrap(`${item.label}${item.safety ? ' [safety-critical]' : ''}`, contentWidth - 110);
      right(resultWord, width - margin, 9.5, record?.result === 'fail' || (!record && item.safety) ? bold : font);
      for (const line of labelLines) {
        newPageIfBelow(12);
        text(line, margin + 8);
        y -= 12;
      }
      if (record) {
        const readings = readingsLine(item, record, pressureUnit);
        if (readings) para(`Readings: ${readings}`, margin + 16, 8.5, font, ink, 11);
        if (record.note) para(`Note: ${record.note}`, margin + 16, 8.5, font, ink, 11);
        para(`Recorded by ${record.recordedBy?.name ?? 'someone'} on ${record.recordedAt.slice(0, 10)}`, margin + 16, 8, font, grey, 10);
      }
      if (signOff) {
        para(`UNRESOLVED: ${record ? 'failed' : 'not recorded'}; signed off by ${signOff.signedBy?.name ?? 'the owner'} on ${signOff.signedAt.slice(0, 10)}.`, margin + 16, 9, bold, alarm, 11.5);
        para(`Reason: ${signOff.reason}`, margin + 16, 9, font, alarm, 11.5);
        para(`Customer told: ${signOff.customerToldHow}`, margin + 16, 9, font, alarm, 11.5);
      } else if (blocker) {
        para(`OPEN SAFETY ITEM: ${blocker.reason === 'failed' ? 'failed' : 'not recorded'}; the vehicle is not to be handed over until it is fixed and recorded, or signed off by the owner.`, margin + 16, 9, bold, alarm, 11.5);
      }
      y -= 3;
    }
  }
  if (job.checklists.length === 0) {
    heading('Checklists');
    para('No checklist on this job.', margin);
  }

  // ── Parts ──
  heading('Parts issued to the job (at cost)');
  if (job.partLines.length === 0) para('None.', margin);
  for (const l of job.partLines) {
    newPageIfBelow(14);
    text(l.partNumber, margin);
    const desc = wrap(l.partDescription, width - margin - 140 - (margin + 100))[0] ?? '';
    text(desc, margin + 100);
    right(String(l.quantity), width - margin - 90);
    right(money(l.costMinor), width - margin);
    y -= 13;
  }
  if (job.specialOrders.length) {
    y -= 2;
    text('Special orders', margin, 9.5, bold);
    y -= 12;
    for (const o of job.specialOrders) para(`${o.quantity} x ${o.partNumber} ${o.partDescription}: ${o.status}${o.note ? ` (${o.note})` : ''}`, margin + 8, 9);
  }

  // ── Labour ──
  heading('Labour');
  if (job.labour.length === 0) para('None.', margin);
  for (const l of job.labour) {
    newPageIfBelow(14);
    const hours = (l.minutes / 60).toFixed(2);
    text(l.workedOn, margin);
    text(wrap(`${l.user.name}: ${l.description}`, width - margin - 140 - (margin + 70))[0] ?? '', margin + 70);
    right(`${hours} h`, width - margin - 90);
    right(money(l.costMinor), width - margin);
    y -= 13;
  }

  // ── Cost ──
  heading('Job cost');
  const costRow = (label: string, minor: number, f: PDFFont = font) => {
    newPageIfBelow(14);
    text(label, margin, 10, f);
    right(money(minor), width - margin, 10, f);
    y -= 14;
  };
  costRow('Parts at cost', job.cost.partsMinor);
  costRow(`Labour (${(job.cost.labourMinutes / 60).toFixed(2)} h)`, job.cost.labourMinor);
  costRow('Total', job.cost.totalMinor, bold);

  // ── Cautions and the deferral ──
  if (cautions.size) {
    heading('Cautions');
    for (const id of cautions) {
      const c = cautionTexts[id];
      para(c.title, margin, 9.5, bold);
      para(c.text, margin, 8.5, font, ink, 11);
      y -= 3;
    }
  }
  heading('Please note');
  para(safetyDeferral, margin, 9);
  para(jobSheetDisclaimer, margin, 9, bold);

  const pages = doc.getPages();
  pages.forEach((p, i) => {
    const label = printable(`Job ${job.number} - page ${i + 1} of ${pages.length}`);
    p.drawText(label, { x: width - margin - font.widthOfTextAtSize(label, 8), y: margin - 20, size: 8, font, color: grey });
  });
  return Buffer.from(await doc.save());
}
