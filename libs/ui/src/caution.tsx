import type { ReactNode } from 'react';
import { cn } from './cn';
import { IconCaution } from './icons';

export interface CautionProps {
  /** A short heading, e.g. "Brake hydraulics". */
  title: string;
  children: ReactNode;
  className?: string;
}

/**
 * A safety caution: striped edge, triangle and the word "Caution". Reserved for things that can
 * hurt people (brakes, tyres, fuel, electrics); never use it for ordinary warnings.
 */
export function Caution({ title, children, className }: CautionProps) {
  return (
    <div
      role="note"
      aria-label={`Safety caution: ${title}`}
      className={cn('flex overflow-hidden rounded-md border-2 border-caution-ink bg-surface text-ink', className)}
    >
      <div className="caution-stripes w-3 shrink-0" aria-hidden="true" />
      <div className="flex gap-3 p-4">
        <span className="flex h-9 w-9 shrink-0 items-center justify-center rounded-sm bg-caution text-caution-ink">
          <IconCaution size={24} />
        </span>
        <div>
          <p className="font-bold">
            <span className="mr-2 uppercase tracking-wide">Caution</span>
            <span>{title}</span>
          </p>
          <div className="mt-1">{children}</div>
        </div>
      </div>
    </div>
  );
}
