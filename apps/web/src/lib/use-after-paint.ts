import { startTransition, useEffect, useState } from 'react';

/**
 * Runs `fn` once the browser has shown what is on screen now. A frame callback runs just before
 * its frame is drawn, and the drawn frame reaches the screen a little later, so this waits for the
 * callback of the frame after next, then a macrotask. With no animation frames (a hidden tab, a
 * test environment) it runs after a macrotask. Returns a cancel function.
 */
export function afterPaint(fn: () => void): () => void {
  let timer: ReturnType<typeof setTimeout> | undefined;
  let frame: number | undefined;
  if (typeof requestAnimationFrame === 'function' && typeof document !== 'undefined' && document.visibilityState === 'visible') {
    frame = requestAnimationFrame(() => {
      frame = requestAnimationFrame(() => {
        frame = undefined;
        timer = setTimeout(fn, 0);
      });
    });
  } else {
    timer = setTimeout(fn, 0);
  }
  return () => {
    if (frame !== undefined) cancelAnimationFrame(frame);
    if (timer !== undefined) clearTimeout(timer);
  };
}

/**
 * False until the screen has been painted once: the parts of a screen below its first view (and
 * their code) wait for it, so they do not hold up the first paint on a slow tablet
 * (docs/decisions/026-first-screen-requests.md). They render as a transition, which React does
 * in slices, so a large section does not hold the page still while it renders.
 */
export function useAfterPaint(): boolean {
  const [painted, setPainted] = useState(false);
  useEffect(() => afterPaint(() => startTransition(() => setPainted(true))), []);
  return painted;
}
