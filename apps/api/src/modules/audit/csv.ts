/**
 * One CSV cell: always quoted, quotes doubled. A cell that a spreadsheet would run as a formula
 * (starting with = + - @, or a tab or carriage return) gets a leading `'` (OWASP CSV injection).
 */
export function csvCell(value: unknown): string {
  let text: string;
  if (value === null || value === undefined) text = '';
  else if (value instanceof Date) text = value.toISOString();
  else if (typeof value === 'object') text = JSON.stringify(value);
  else text = String(value);
  if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return `"${text.replace(/"/g, '""')}"`;
}

/** One CSV record with its CRLF line ending (RFC 4180). */
export function csvLine(cells: unknown[]): string {
  return `${cells.map(csvCell).join(',')}\r\n`;
}
