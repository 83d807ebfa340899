import type { SVGProps } from 'react';

/** A lens over a number plate: the lookup in the rail. Decorative (the rail names it in words). */
export function IconLookup({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <circle cx="10" cy="10" r="6.5" />
      <path d="M15 15l5.5 5.5" />
      <path d="M7 10h6M8.5 8v4" />
    </svg>
  );
}
