import { createContext, useCallback, useContext, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { cn } from './cn';
import { IconClose, IconFail, IconInfo, IconOk } from './icons';

export type ToastTone = 'ok' | 'fail' | 'info';

export interface Toast {
  id: number;
  tone: ToastTone;
  message: string;
}

interface ToastApi {
  /** Shows a message. `ok` and `info` fade after a while; `fail` stays until dismissed. */
  show: (message: string, tone?: ToastTone) => number;
  dismiss: (id: number) => void;
}

const ToastContext = createContext<ToastApi | null>(null);

const toneStyle: Record<ToastTone, { className: string; Icon: typeof IconOk; word: string }> = {
  ok: { className: 'border-ok', Icon: IconOk, word: 'Done' },
  fail: { className: 'border-fail', Icon: IconFail, word: 'Problem' },
  info: { className: 'border-accent', Icon: IconInfo, word: 'Note' },
};

export interface ToastProviderProps {
  children: ReactNode;
  /** How long ok/info toasts stay, in milliseconds. */
  duration?: number;
}

/**
 * Holds the toasts and renders them in two live regions that exist from the start (a region
 * added together with its text is often not read): polite for news, assertive for problems.
 */
export function ToastProvider({ children, duration = 6000 }: ToastProviderProps) {
  const [toasts, setToasts] = useState<Toast[]>([]);
  const nextId = useRef(1);
  const timers = useRef(new Map<number, ReturnType<typeof setTimeout>>());

  const dismiss = useCallback((id: number) => {
    setToasts((list) => list.filter((t) => t.id !== id));
    const timer = timers.current.get(id);
    if (timer) clearTimeout(timer);
    timers.current.delete(id);
  }, []);

  const show = useCallback(
    (message: string, tone: ToastTone = 'ok') => {
      const id = nextId.current++;
      setToasts((list) => [...list, { id, tone, message }]);
      if (tone !== 'fail') {
        timers.current.set(
          id,
          setTimeout(() => dismiss(id), duration),
        );
      }
      return id;
    },
    [dismiss, duration],
  );

  useEffect(() => {
    const map = timers.current;
    return () => {
      for (const timer of map.values()) clearTimeout(timer);
      map.clear();
    };
  }, []);

  const api = useMemo(() => ({ show, dismiss }), [show, dismiss]);
  const polite = toasts.filter((t) => t.tone !== 'fail');
  const assertive = toasts.filter((t) => t.tone === 'fail');

  return (
    <ToastContext.Provider value={api}>
      {children}
      <div className="pointer-events-none fixed right-4 bottom-4 left-4 z-[60] flex flex-col items-end gap-2 sm:left-auto sm:w-96">
        <div aria-live="assertive" aria-atomic="false" className="flex w-full flex-col gap-2">
          {assertive.map((t) => (
            <ToastItem key={t.id} toast={t} onDismiss={dismiss} />
          ))}
        </div>
        <div aria-live="polite" aria-atomic="false" className="flex w-full flex-col gap-2">
          {polite.map((t) => (
            <ToastItem key={t.id} toast={t} onDismiss={dismiss} />
          ))}
        </div>
      </div>
    </ToastContext.Provider>
  );
}

function ToastItem({ toast, onDismiss }: { toast: Toast; onDismiss: (id: number) => void }) {
  const { className, Icon, word } = toneStyle[toast.tone];
  return (
    <div
      className={cn(
        'pointer-events-auto flex w-full items-start gap-3 rounded-md border-2 border-l-8 bg-surface p-3 text-ink shadow-raised',
        className,
      )}
    >
      <Icon className="mt-0.5 shrink-0" />
      <p className="flex-1">
        <span className="sr-only">{word}: </span>
        {toast.message}
      </p>
      <button
        type="button"
        onClick={() => onDismiss(toast.id)}
        className="-my-2 -mr-2 inline-flex min-h-touch min-w-touch items-center justify-center rounded-md hover:bg-sunk"
        aria-label="Dismiss"
      >
        <IconClose size={18} />
      </button>
    </div>
  );
}

/** The toast functions of the nearest ToastProvider. */
export function useToast(): ToastApi {
  const api = useContext(ToastContext);
  if (!api) throw new Error('useToast needs a <ToastProvider> above it.');
  return api;
}
