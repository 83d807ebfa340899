import type { PDFFont } from 'pdf-lib';

/**
 * Text for pdf-lib's standard fonts, which encode WinAnsi only: typographic spaces, quotes,
 * dashes, the ellipsis and the multiplication sign become their plain forms; Latin-1 and the euro
 * sign stay; anything else becomes "?" rather than failing the whole document.
 */
export function printable(text: string): string {
  return text
    .replace(/[\u00a0\u202f\u2009]/g, ' ')
    .replace(/[\u2018\u2019]/g, "'")
    .replace(/[\u201c\u201d]/g, '"')
    .replace(/[\u2013\u2014\u2212]/g, '-')
    .replace(/\u2026/g, '...')
    .replace(/\u00d7/g, 'x')
    .replace(/[^\x20-\x7e\u00a1-\u00ff\u20ac]/g, '?');
}

/** `text` made printable and cut with "..." so it fits `maxWidth` points at `size`. */
export function fitText(font: PDFFont, text: string, maxWidth: number, size = 10): string {
  let p = printable(text);
  if (font.widthOfTextAtSize(p, size) <= maxWidth) return p;
  while (p.length > 1 && font.widthOfTextAtSize(`${p}...`, size) > maxWidth) p = p.slice(0, -1);
  return `${p}...`;
}
