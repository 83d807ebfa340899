import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvLine, readCsv } from '../imports/csv';

// The CSV formula guard (issue 13, OWASP CSV injection): an exported cell never starts with what a
// spreadsheet runs as a formula, and the importer undoes the guard, so export → import is exact.

/** Text as the app stores it (trimmed on entry), often starting like a formula or an earlier guard. */
const cellText = fc
  .oneof(fc.string({ unit: 'grapheme', maxLength: 40 }), fc.tuple(fc.constantFrom('=', '+', '-', '@', "'", "'=", "''+", '=-'), fc.string({ unit: 'grapheme', maxLength: 40 })).map(([a, b]) => a + b))
  .filter((s) => s === s.trim() && !s.includes('\u0000'));

async function readBack(file: string): Promise<string[]> {
  const out: string[] = [];
  for await (const event of readCsv(Buffer.from(file), { known: ['text', 'marker'], required: ['text'] })) {
    if (event.type === 'error') throw new Error(event.message);
    out.push(event.record.cells.get('text')!);
  }
  return out;
}

describe('the CSV formula guard', () => {
  it('never lets an exported cell start like a formula, and imports every cell back exactly', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(cellText, { minLength: 1, maxLength: 8 }), async (texts) => {
        const lines = texts.map((t) => csvLine([t, 'x']));
        for (const line of lines) expect(line.replace(/^"/, '')).not.toMatch(/^[=+\-@]/);
        expect(await readBack(csvLine(['text', 'marker']) + lines.join(''))).toEqual(texts);
      }),
      { numRuns: 300 },
    );
  });
});
