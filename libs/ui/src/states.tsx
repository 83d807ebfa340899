import type { ReactNode } from 'react';
import { Button } from './button';
import { cn } from './cn';
import { IconFail } from './icons';
import { Spinner } from './spinner';

/** A spinner with words, announced politely to screen readers. */
export function LoadingState({ label = 'Loading…', className }: { label?: string; className?: string }) {
  return (
    <div role="status" className={cn('flex items-center gap-3 py-8 text-ink-muted', className)}>
      <Spinner size={24} className="text-accent" />
      <span>{label}</span>
    </div>
  );
}

export interface EmptyStateProps {
  title: string;
  /** Say how to fill it. */
  children?: ReactNode;
  /** An action that fills it, e.g. a button or link. */
  action?: ReactNode;
  icon?: ReactNode;
  className?: string;
}

/** What to show where a list or page has nothing yet, and how to change that. */
export function EmptyState({ title, children, action, icon, className }: EmptyStateProps) {
  return (
    <div className={cn('flex flex-col items-start gap-2 rounded-lg border-2 border-dashed border-line p-6', className)}>
      {icon && <div className="text-ink-muted">{icon}</div>}
      <p className="text-lg font-bold">{title}</p>
      {children && <div className="text-ink-muted">{children}</div>}
      {action && <div className="mt-2">{action}</div>}
    </div>
  );
}

export interface ErrorStateProps {
  title?: string;
  /** What went wrong, in words a person can act on. */
  message: string;
  /** Offer a retry when the failure may be passing. */
  onRetry?: () => void;
  className?: string;
}

/** A failure the person should know about, with a retry where one makes sense. */
export function ErrorState({ title = 'Something went wrong', message, onRetry, className }: ErrorStateProps) {
  return (
    <div role="alert" className={cn('flex gap-3 rounded-lg border-2 border-fail bg-fail-soft p-4 text-ink', className)}>
      <IconFail className="mt-0.5 shrink-0 text-fail" />
      <div className="flex flex-col items-start gap-2">
        <p className="font-bold">{title}</p>
        <p>{message}</p>
        {onRetry && (
          <Button variant="secondary" size="sm" onClick={onRetry}>
            Try again
          </Button>
        )}
      </div>
    </div>
  );
}
