import bwipjs from 'bwip-js/node';

/** A Code 128 symbol as alternating bar and space widths in modules, starting with a bar. */
export interface LinearSymbol {
  widths: number[];
  /** Sum of the widths. */
  modules: number;
}

/** A square 2D symbol: `size` × `size` modules, `dark[row * size + col]` true for a dark module. */
export interface MatrixSymbol {
  size: number;
  dark: boolean[];
}

/** Encodes `text` as Code 128 (bwip-js picks code sets A/B/C). The caller adds the quiet zones. */
export function code128(text: string): LinearSymbol {
  const [symbol] = bwipjs.raw('code128', text, {});
  if (!symbol || !('sbs' in symbol)) throw new Error('bwip-js returned no Code 128 symbol.');
  return { widths: symbol.sbs, modules: symbol.sbs.reduce((a, b) => a + b, 0) };
}

/** Encodes `text` as a QR code, error correction level M. The caller adds the quiet zone. */
export function qrCode(text: string): MatrixSymbol {
  const [symbol] = bwipjs.raw('qrcode', text, 'eclevel=M');
  if (!symbol || !('pixs' in symbol)) throw new Error('bwip-js returned no QR symbol.');
  if (symbol.pixx !== symbol.pixy) throw new Error('A QR symbol is square.');
  return { size: symbol.pixx, dark: symbol.pixs.map((p) => p === 1) };
}
