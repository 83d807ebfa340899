import type { SVGProps } from 'react';

/** A tag tied to a key ring: vehicles held for their owners. Decorative (the rail names it in words). */
export function IconConsignment({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <path d="M3 12V4h8l10 10-8 8z" />
      <circle cx="7.5" cy="8.5" r="1.5" />
      <path d="M11 15l3-3" />
    </svg>
  );
}
