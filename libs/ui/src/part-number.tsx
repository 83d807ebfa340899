import type { ReactNode } from 'react';
import { cn } from './cn';

/**
 * A part, frame or engine number as printed: monospaced, tabular, a touch larger than the text
 * around it, separators kept. Never normalise what is shown here.
 */
export function PartNumber({ children, className }: { children: ReactNode; className?: string }) {
  return <span className={cn('font-mono text-num font-medium tabular whitespace-nowrap', className)}>{children}</span>;
}

/** A quantity or amount: monospaced with tabular figures so columns line up. */
export function Num({ children, className }: { children: ReactNode; className?: string }) {
  return <span className={cn('font-mono tabular', className)}>{children}</span>;
}
