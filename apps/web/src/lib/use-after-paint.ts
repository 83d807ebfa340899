import { startTransition, useEffect, useState, type RefObject } from 'react';

/** How long to wait for the browser to report a marked element before going on without it. */
export const shownTimeoutMs = 1000;

function visible(): boolean {
  return typeof document !== 'undefined' && document.visibilityState === 'visible';
}

function reportsShownElements(): boolean {
  return typeof PerformanceObserver === 'function' && (PerformanceObserver.supportedEntryTypes ?? []).includes('element');
}

/**
 * Runs `fn` once the browser has shown what is on screen now.
 *
 * Given an element marked with an `elementtiming` attribute, and where the browser reports when
 * such elements reach the screen (Element Timing, in Chromium), it waits for that report: a
 * drawn frame reaches the screen some frames after its frame callbacks, later still on a busy
 * tablet, and work started before then competes with the first view. Should no report come within
 * `shownTimeoutMs` (an element already shown once, or off screen), it goes on.
 *
 * Otherwise it waits for the callback of the frame after next, then a macrotask. With no
 * animation frames (a hidden tab, a test environment) it runs after a macrotask. Returns a cancel
 * function.
 */
export function afterPaint(fn: () => void, shown?: Element | null): () => void {
  let timer: ReturnType<typeof setTimeout> | undefined;
  let frame: number | undefined;
  if (shown && visible() && reportsShownElements()) {
    let cap: ReturnType<typeof setTimeout> | undefined = undefined;
    const observer = new PerformanceObserver((entries) => {
      if (entries.getEntries().some((entry) => (entry as PerformanceEntry & { element?: Element | null }).element === shown)) go();
    });
    const go = () => {
      observer.disconnect();
      clearTimeout(cap);
      timer ??= setTimeout(fn, 0);
    };
    cap = setTimeout(go, shownTimeoutMs);
    // Buffered: the report may have come between the render and this call.
    observer.observe({ type: 'element', buffered: true });
    return () => {
      observer.disconnect();
      clearTimeout(cap);
      clearTimeout(timer);
    };
  }
  if (typeof requestAnimationFrame === 'function' && visible()) {
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
 * False until the screen has been painted once (with `shown`, until that element has reached the
 * screen, see afterPaint): the parts of a screen below its first view (and their code) wait for
 * it, so they do not hold up the first paint on a slow tablet
 * (docs/decisions/026-first-screen-requests.md, 027-part-page-first-load.md). They render as a
 * transition, which React does in slices, so a large section does not hold the page still while
 * it renders.
 */
export function useAfterPaint(shown?: RefObject<Element | null>): boolean {
  const [painted, setPainted] = useState(false);
  // The ref is read after the first commit: the element is on the page by then (or not rendered).
  useEffect(() => afterPaint(() => startTransition(() => setPainted(true)), shown?.current), [shown]);
  return painted;
}
