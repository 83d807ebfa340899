import { act, renderHook } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { afterPaint, shownTimeoutMs, useAfterPaint } from './use-after-paint';

describe('afterPaint', () => {
  afterEach(() => vi.useRealTimers());

  it('runs after two frames and a macrotask, not before', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'requestAnimationFrame', 'cancelAnimationFrame'] });
    const fn = vi.fn();
    afterPaint(fn);
    expect(fn).not.toHaveBeenCalled();
    vi.advanceTimersToNextFrame();
    expect(fn).not.toHaveBeenCalled();
    vi.advanceTimersToNextFrame();
    expect(fn).not.toHaveBeenCalled();
    await vi.advanceTimersByTimeAsync(1);
    expect(fn).toHaveBeenCalledTimes(1);
  });

  it('can be cancelled before it runs', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'requestAnimationFrame', 'cancelAnimationFrame'] });
    const fn = vi.fn();
    const cancel = afterPaint(fn);
    vi.advanceTimersToNextFrame();
    cancel();
    await vi.advanceTimersByTimeAsync(100);
    expect(fn).not.toHaveBeenCalled();
  });

  it('uses a plain macrotask when the page is hidden (no frames come)', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'requestAnimationFrame', 'cancelAnimationFrame'] });
    const visibility = vi.spyOn(document, 'visibilityState', 'get').mockReturnValue('hidden');
    const fn = vi.fn();
    afterPaint(fn);
    await vi.advanceTimersByTimeAsync(1);
    expect(fn).toHaveBeenCalledTimes(1);
    visibility.mockRestore();
  });
});

/** A stand-in for the browser's PerformanceObserver that reports Element Timing entries on demand. */
function fakeElementTiming() {
  const observers: Array<{ callback: PerformanceObserverCallback; connected: boolean }> = [];
  class FakeObserver {
    static supportedEntryTypes = ['element', 'largest-contentful-paint'];
    private readonly entry: { callback: PerformanceObserverCallback; connected: boolean };
    constructor(callback: PerformanceObserverCallback) {
      this.entry = { callback, connected: false };
      observers.push(this.entry);
    }
    observe() {
      this.entry.connected = true;
    }
    disconnect() {
      this.entry.connected = false;
    }
  }
  vi.stubGlobal('PerformanceObserver', FakeObserver);
  return {
    /** The browser reports that `element` has reached the screen. */
    report(element: Element) {
      const list = { getEntries: () => [{ entryType: 'element', element }] } as unknown as PerformanceObserverEntryList;
      for (const o of observers) if (o.connected) o.callback(list, o as unknown as PerformanceObserver);
    },
    connected: () => observers.filter((o) => o.connected).length,
  };
}

describe('afterPaint with an element to wait for (Element Timing)', () => {
  afterEach(() => {
    vi.useRealTimers();
    vi.unstubAllGlobals();
  });

  it('runs once the browser reports that element on screen, not for another element', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'requestAnimationFrame', 'cancelAnimationFrame'] });
    const timing = fakeElementTiming();
    const heading = document.createElement('span');
    const fn = vi.fn();
    afterPaint(fn, heading);
    // Frames alone do not release it: the heading may not have reached the screen yet.
    vi.advanceTimersToNextFrame();
    vi.advanceTimersToNextFrame();
    await vi.advanceTimersByTimeAsync(10);
    timing.report(document.createElement('span'));
    await vi.advanceTimersByTimeAsync(1);
    expect(fn).not.toHaveBeenCalled();
    timing.report(heading);
    await vi.advanceTimersByTimeAsync(1);
    expect(fn).toHaveBeenCalledTimes(1);
    expect(timing.connected()).toBe(0);
    // The time-out that was the safety net does not run it again.
    await vi.advanceTimersByTimeAsync(shownTimeoutMs);
    expect(fn).toHaveBeenCalledTimes(1);
  });

  it('goes on without the report after the time-out', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'requestAnimationFrame', 'cancelAnimationFrame'] });
    const timing = fakeElementTiming();
    const fn = vi.fn();
    afterPaint(fn, document.createElement('span'));
    await vi.advanceTimersByTimeAsync(shownTimeoutMs - 1);
    expect(fn).not.toHaveBeenCalled();
    await vi.advanceTimersByTimeAsync(2);
    expect(fn).toHaveBeenCalledTimes(1);
    expect(timing.connected()).toBe(0);
  });

  it('can be cancelled: neither the report nor the time-out runs it', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'requestAnimationFrame', 'cancelAnimationFrame'] });
    const timing = fakeElementTiming();
    const heading = document.createElement('span');
    const fn = vi.fn();
    const cancel = afterPaint(fn, heading);
    cancel();
    timing.report(heading);
    await vi.advanceTimersByTimeAsync(shownTimeoutMs * 2);
    expect(fn).not.toHaveBeenCalled();
  });

  it('falls back to the frames where the browser does not report elements', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'requestAnimationFrame', 'cancelAnimationFrame'] });
    vi.stubGlobal('PerformanceObserver', class {
      static supportedEntryTypes = ['paint'];
    });
    const fn = vi.fn();
    afterPaint(fn, document.createElement('span'));
    vi.advanceTimersToNextFrame();
    vi.advanceTimersToNextFrame();
    await vi.advanceTimersByTimeAsync(1);
    expect(fn).toHaveBeenCalledTimes(1);
  });
});

describe('useAfterPaint', () => {
  it('is false on the first render and true once painted', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'requestAnimationFrame', 'cancelAnimationFrame'] });
    const { result } = renderHook(() => useAfterPaint());
    expect(result.current).toBe(false);
    await act(async () => {
      vi.advanceTimersToNextFrame();
      vi.advanceTimersToNextFrame();
      await vi.advanceTimersByTimeAsync(1);
    });
    expect(result.current).toBe(true);
    vi.useRealTimers();
  });
});
