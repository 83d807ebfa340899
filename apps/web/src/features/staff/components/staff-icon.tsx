import type { SVGProps } from 'react';

/** Two people side by side: the shop's staff in the rail. Decorative (the rail names it in words). */
export function IconStaff({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <circle cx="8.5" cy="8" r="3" />
      <path d="M3 19c0-3 2.5-5 5.5-5s5.5 2 5.5 5" />
      <circle cx="16.5" cy="9" r="2.5" />
      <path d="M15.5 14.2c2.9-.4 5.5 1.4 5.5 4.8" />
    </svg>
  );
}
