import { useCallback, useRef } from 'react';

/** Keystrokes closer together than this are a machine typing (a keyboard-wedge scanner), not a person. */
export const SCANNER_GAP_MS = 35;
/** Scanned codes are at least this long; shorter bursts are a fast typist. */
export const SCANNER_MIN_LENGTH = 4;

/**
 * Tells a keyboard-wedge barcode scanner from a person: the scanner "types" the whole code with a
 * few milliseconds between keys and then presses Enter. Feed it every keydown of the field;
 * `wasScanned()` at Enter says whether the current text came in one fast burst.
 */
export function useScannerInput(now: () => number = () => performance.now()) {
  const burst = useRef({ last: -Infinity, length: 0 });

  const onKey = useCallback(
    (key: string) => {
      if (key.length !== 1) return;
      const t = now();
      const b = burst.current;
      b.length = t - b.last <= SCANNER_GAP_MS ? b.length + 1 : 1;
      b.last = t;
    },
    [now],
  );

  const wasScanned = useCallback(() => {
    const b = burst.current;
    return b.length >= SCANNER_MIN_LENGTH && now() - b.last <= SCANNER_GAP_MS * 3;
  }, [now]);

  const reset = useCallback(() => {
    burst.current = { last: -Infinity, length: 0 };
  }, []);

  return { onKey, wasScanned, reset };
}
