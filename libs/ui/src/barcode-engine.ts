/**
 * Reading barcodes from a playing <video>: the browser's own BarcodeDetector where it exists and
 * knows our formats, otherwise ZXing, loaded only when needed so it stays out of the first bundle.
 */

/** What the camera scanner reads: Code 128 (our labels), QR (our labels), EAN/UPC (suppliers'). */
export const scanFormats = ['code_128', 'qr_code', 'ean_13', 'ean_8', 'upc_a', 'upc_e'] as const;
export type ScanFormat = (typeof scanFormats)[number];

/** The part of the Barcode Detection API we use (not in TypeScript's DOM library yet). */
interface DetectedBarcode {
  rawValue: string;
  format: string;
}
interface BarcodeDetectorLike {
  detect(source: HTMLVideoElement): Promise<DetectedBarcode[]>;
}
interface BarcodeDetectorClass {
  new (options: { formats: string[] }): BarcodeDetectorLike;
  getSupportedFormats(): Promise<string[]>;
}

export interface BarcodeEngine {
  /** Which reader runs: the browser's own, or ZXing. */
  kind: 'native' | 'zxing';
  stop(): void;
}

/** Time between two looks at the picture with the native detector. */
const nativeIntervalMs = 150;

async function nativeEngine(video: HTMLVideoElement, onCode: (code: string, format: string) => void): Promise<BarcodeEngine | null> {
  const Detector = (globalThis as { BarcodeDetector?: BarcodeDetectorClass }).BarcodeDetector;
  if (!Detector) return null;
  let supported: string[] = [];
  try {
    supported = await Detector.getSupportedFormats();
  } catch {
    return null;
  }
  const formats = scanFormats.filter((f) => supported.includes(f));
  // A detector without Code 128 or QR cannot read our own labels: use ZXing instead.
  if (!formats.includes('code_128') || !formats.includes('qr_code')) return null;
  const detector = new Detector({ formats });
  let stopped = false;
  let timer: ReturnType<typeof setTimeout> | undefined;
  const look = async () => {
    if (stopped) return;
    try {
      const [found] = await detector.detect(video);
      if (found && !stopped && found.rawValue) {
        onCode(found.rawValue, found.format);
        return;
      }
    } catch {
      // A frame that is not ready yet (readyState < 2) throws; the next one will do.
    }
    if (!stopped) timer = setTimeout(() => void look(), nativeIntervalMs);
  };
  void look();
  return {
    kind: 'native',
    stop() {
      stopped = true;
      clearTimeout(timer);
    },
  };
}

async function zxingEngine(video: HTMLVideoElement, onCode: (code: string, format: string) => void): Promise<BarcodeEngine> {
  const [{ BrowserMultiFormatReader }, { BarcodeFormat, DecodeHintType }] = await Promise.all([import('@zxing/browser'), import('@zxing/library')]);
  const hints = new Map<number, unknown>([
    [DecodeHintType.POSSIBLE_FORMATS, [BarcodeFormat.CODE_128, BarcodeFormat.QR_CODE, BarcodeFormat.EAN_13, BarcodeFormat.EAN_8, BarcodeFormat.UPC_A, BarcodeFormat.UPC_E]],
  ]);
  const reader = new BrowserMultiFormatReader(hints, { delayBetweenScanAttempts: 150 });
  let stopped = false;
  const controls = await reader.decodeFromVideoElement(video, (result) => {
    if (result && !stopped) onCode(result.getText(), BarcodeFormat[result.getBarcodeFormat()] ?? 'unknown');
  });
  return {
    kind: 'zxing',
    stop() {
      stopped = true;
      controls.stop();
    },
  };
}

/**
 * Starts reading codes from `video` (which must already show the camera). `onCode` may be called
 * more than once for the same code: the caller stops the engine after the first.
 */
export async function startBarcodeEngine(video: HTMLVideoElement, onCode: (code: string, format: string) => void): Promise<BarcodeEngine> {
  return (await nativeEngine(video, onCode)) ?? zxingEngine(video, onCode);
}
