/** Tappet's mark and name. The mark is a valve tappet seen from the side: stem and foot. */
export function Brand({ compact = false }: { compact?: boolean }) {
  return (
    <span className="inline-flex items-center gap-2 text-lg font-bold text-ink">
      <svg width="28" height="28" viewBox="0 0 32 32" aria-hidden="true" focusable="false" className="shrink-0">
        <rect width="32" height="32" rx="7" className="fill-accent" />
        <path d="M9 10h14M16 10v14" className="stroke-accent-ink" strokeWidth="3.5" strokeLinecap="round" />
        <circle cx="16" cy="24" r="3" className="fill-accent-ink" />
      </svg>
      <span className={compact ? 'sr-only sm:not-sr-only' : undefined}>Tappet</span>
    </span>
  );
}
