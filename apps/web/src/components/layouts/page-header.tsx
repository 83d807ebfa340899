import type { ReactNode } from 'react';

/** The top of a page: what it is (the h1), an optional line under it and actions on the right. */
export function PageHeader({ title, eyebrow, description, actions }: { title: string; eyebrow?: string; description?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <div className="min-w-0">
        {eyebrow && <p className="text-sm font-bold tracking-wide text-ink-muted uppercase">{eyebrow}</p>}
        <h1 className="text-xl font-bold break-words">{title}</h1>
        {description && <div className="mt-1 max-w-prose text-ink-muted">{description}</div>}
      </div>
      {actions && <div className="flex gap-2">{actions}</div>}
    </div>
  );
}
