import { describe, expect, it } from 'vitest';
import { readCsv, ROWS_PER_BREATH } from '../imports/csv';

const columns = { known: ['number', 'description'], required: ['number'] };

describe('reading a long CSV', () => {
  it('lets other requests run while it reads, and still hands out every row in order', async () => {
    const rows = ROWS_PER_BREATH * 10;
    const text = 'number,description\r\n' + Array.from({ length: rows }, (_, i) => `XQ-${i},Part ${i}\r\n`).join('');
    // Counts turns of the event loop's check phase (where other requests' I/O callbacks follow)
    // while the file is read: without pauses the reader's microtasks hold the loop to the end.
    let turns = 0;
    let reading = true;
    const tick = () => {
      turns++;
      if (reading) setImmediate(tick);
    };
    setImmediate(tick);
    const numbers: string[] = [];
    for await (const event of readCsv(Buffer.from(text), columns)) {
      if (event.type === 'record') numbers.push(event.record.cells.get('number')!);
    }
    reading = false;
    expect(numbers).toHaveLength(rows);
    expect(numbers[0]).toBe('XQ-0');
    expect(numbers.at(-1)).toBe(`XQ-${rows - 1}`);
    expect(turns).toBeGreaterThanOrEqual(9);
  });
});
