import type { SVGProps } from 'react';

/** Shelving with boxes: stock in the rail. Decorative (the rail names it in words). */
export function IconStock({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <path d="M3 3v18M21 3v18M3 12h18M3 20h18" />
      <rect x="6" y="6.5" width="5" height="5.5" />
      <rect x="13" y="15" width="5" height="5" />
    </svg>
  );
}
