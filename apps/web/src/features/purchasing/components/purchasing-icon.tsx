import type { SVGProps } from 'react';

/** A delivery crate with an arrow in: purchasing in the rail. Decorative (the rail names it in words). */
export function IconPurchasing({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <path d="M3 10h18v10H3z" />
      <path d="M12 2v9M8.5 7.5 12 11l3.5-3.5" />
      <path d="M9 14h6" />
    </svg>
  );
}
