import { afterEach, describe, expect, it, vi } from 'vitest';
import { startBarcodeEngine } from './barcode-engine';

// ZXing is replaced by a stand-in that "reads" one code, so the test checks the choice of reader
// and the formats asked for, not ZXing itself (its decoding is checked in the API's label tests).
const zxing = vi.hoisted(() => ({ stop: vi.fn(), hints: null as Map<number, unknown> | null }));
vi.mock('@zxing/browser', () => ({
  BrowserMultiFormatReader: class {
    constructor(hints: Map<number, unknown>) {
      zxing.hints = hints;
    }
    async decodeFromVideoElement(_video: unknown, cb: (result: { getText(): string; getBarcodeFormat(): number }) => void) {
      setTimeout(() => cb({ getText: () => 'HW-1042-B', getBarcodeFormat: () => 4 }), 0);
      return { stop: zxing.stop };
    }
  },
}));

afterEach(() => vi.unstubAllGlobals());

describe('startBarcodeEngine', () => {
  it('loads ZXing when the browser has no BarcodeDetector, for Code 128, QR and EAN/UPC', async () => {
    const onCode = vi.fn();
    const engine = await startBarcodeEngine(document.createElement('video'), onCode);
    expect(engine.kind).toBe('zxing');
    await vi.waitFor(() => expect(onCode).toHaveBeenCalledWith('HW-1042-B', 'CODE_128'));
    const { BarcodeFormat, DecodeHintType } = await import('@zxing/library');
    expect(zxing.hints?.get(DecodeHintType.POSSIBLE_FORMATS)).toEqual([BarcodeFormat.CODE_128, BarcodeFormat.QR_CODE, BarcodeFormat.EAN_13, BarcodeFormat.EAN_8, BarcodeFormat.UPC_A, BarcodeFormat.UPC_E]);
    engine.stop();
    expect(zxing.stop).toHaveBeenCalled();
  });

  it('uses ZXing too when the browser detector cannot read Code 128', async () => {
    const Detector = vi.fn();
    vi.stubGlobal('BarcodeDetector', Object.assign(Detector, { getSupportedFormats: async () => ['qr_code', 'ean_13'] }));
    const engine = await startBarcodeEngine(document.createElement('video'), () => {});
    expect(engine.kind).toBe('zxing');
    expect(Detector).not.toHaveBeenCalled();
    engine.stop();
  });

  it('uses the browser detector when it reads our formats', async () => {
    const detect = vi.fn(async () => [{ rawValue: 'A-01-03', format: 'qr_code' }]);
    vi.stubGlobal('BarcodeDetector', Object.assign(vi.fn(function () { return { detect }; }), { getSupportedFormats: async () => ['code_128', 'qr_code'] }));
    const onCode = vi.fn();
    const engine = await startBarcodeEngine(document.createElement('video'), onCode);
    expect(engine.kind).toBe('native');
    await vi.waitFor(() => expect(onCode).toHaveBeenCalledWith('A-01-03', 'qr_code'));
    engine.stop();
  });
});
