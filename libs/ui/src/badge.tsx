import type { ReactNode } from 'react';
import { cn } from './cn';
import { IconAdvise, IconFail, IconNotApplicable, IconOk } from './icons';

export type BadgeTone = 'neutral' | 'accent';

/** A small label (a role, a method). Neutral or accent only: states use StatusPill. */
export function Badge({ tone = 'neutral', children, className }: { tone?: BadgeTone; children: ReactNode; className?: string }) {
  return (
    <span
      className={cn(
        'inline-flex items-center gap-1 rounded-sm border px-2 py-0.5 text-sm font-bold',
        tone === 'accent' ? 'border-accent bg-accent-soft text-accent' : 'border-line-strong bg-sunk text-ink',
        className,
      )}
    >
      {children}
    </span>
  );
}

export type Status = 'ok' | 'advise' | 'fail' | 'na';

const statusStyle: Record<Status, { word: string; className: string; Icon: typeof IconOk }> = {
  ok: { word: 'OK', className: 'border-ok bg-ok-soft text-ok', Icon: IconOk },
  advise: { word: 'Advise', className: 'border-advise bg-advise-soft text-advise', Icon: IconAdvise },
  fail: { word: 'Fail', className: 'border-fail bg-fail-soft text-fail', Icon: IconFail },
  na: { word: 'Not applicable', className: 'border-na bg-na-soft text-na', Icon: IconNotApplicable },
};

/** The default word shown for each status. */
export const statusWords: Record<Status, string> = {
  ok: statusStyle.ok.word,
  advise: statusStyle.advise.word,
  fail: statusStyle.fail.word,
  na: statusStyle.na.word,
};

/**
 * A result state: colour, a shape of its own and a word, so it never relies on colour alone.
 * `label` replaces the default word where the trade has a better one.
 */
export function StatusPill({ status, label, className }: { status: Status; label?: string; className?: string }) {
  const { word, className: tone, Icon } = statusStyle[status];
  return (
    <span
      className={cn('inline-flex items-center gap-1.5 rounded-full border-2 py-0.5 pr-3 pl-1.5 text-sm font-bold', tone, className)}
      data-status={status}
    >
      <Icon size={18} />
      <span>{label ?? word}</span>
    </span>
  );
}
