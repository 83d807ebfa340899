import { act, renderHook } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { afterPaint, useAfterPaint } from './use-after-paint';

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
