import { act, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ToastProvider, useToast } from './toast';

function Trigger({ message, tone }: { message: string; tone?: 'ok' | 'fail' | 'info' }) {
  const toast = useToast();
  return (
    <button type="button" onClick={() => toast.show(message, tone)}>
      Go
    </button>
  );
}

afterEach(() => vi.useRealTimers());

describe('Toasts', () => {
  it('puts news in a polite live region and lets it fade', () => {
    vi.useFakeTimers();
    render(
      <ToastProvider duration={1000}>
        <Trigger message="Shop name saved." />
      </ToastProvider>,
    );
    const polite = document.querySelector('[aria-live="polite"]');
    expect(polite).toBeEmptyDOMElement();
    act(() => screen.getByRole('button', { name: 'Go' }).click());
    expect(polite).toHaveTextContent('Shop name saved.');
    act(() => vi.advanceTimersByTime(1000));
    expect(screen.queryByText('Shop name saved.')).not.toBeInTheDocument();
  });

  it('announces problems assertively and keeps them until dismissed', () => {
    vi.useFakeTimers();
    render(
      <ToastProvider duration={1000}>
        <Trigger message="Could not save." tone="fail" />
      </ToastProvider>,
    );
    act(() => screen.getByRole('button', { name: 'Go' }).click());
    const assertive = document.querySelector('[aria-live="assertive"]');
    expect(assertive).toHaveTextContent('Problem: Could not save.');
    act(() => vi.advanceTimersByTime(10_000));
    expect(assertive).toHaveTextContent('Could not save.');
    act(() => screen.getByRole('button', { name: 'Dismiss' }).click());
    expect(assertive).toBeEmptyDOMElement();
  });

  it('refuses to work outside a provider', () => {
    vi.spyOn(console, 'error').mockImplementation(() => undefined);
    expect(() => render(<Trigger message="x" />)).toThrow(/ToastProvider/);
  });
});
