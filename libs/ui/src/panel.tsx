import { useId, type ReactNode } from 'react';
import { cn } from './cn';

export interface PanelProps {
  /** The heading (an h2), which also names the section for assistive technology. */
  title: ReactNode;
  /** The heading's id, where something else points at it; one is made otherwise. */
  id?: string;
  /** Buttons beside the heading (they wrap below it on a narrow screen). */
  actions?: ReactNode;
  className?: string;
  children: ReactNode;
}

/** A titled, framed block of a screen: a section named by its heading, with room for actions beside the title. */
export function Panel({ title, id, actions, className, children }: PanelProps) {
  const madeId = useId();
  const headingId = id ?? madeId;
  return (
    <section aria-labelledby={headingId} className={cn('flex flex-col gap-4 rounded-lg border-2 border-line bg-surface p-5', className)}>
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id={headingId} className="text-lg font-bold">
          {title}
        </h2>
        {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
      </div>
      {children}
    </section>
  );
}
