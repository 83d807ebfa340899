import type { SVGProps } from 'react';

/** A clipboard with tally marks: stock counts in the rail. Decorative (the rail names it in words). */
export function IconCounts({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <rect x="5" y="4" width="14" height="17" rx="1" />
      <path d="M9 2.5h6v3H9zM8.5 10v6M11 10v6M13.5 10v6M16 10v6M7.5 15l10-4" />
    </svg>
  );
}
