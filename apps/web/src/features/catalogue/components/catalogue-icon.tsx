import type { SVGProps } from 'react';

/** An open parts book: the catalogue in the rail. Decorative (the rail names it in words). */
export function IconCatalogue({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <path d="M12 6.5C10 5 7 4.5 3.5 5v13c3.5-.5 6.5 0 8.5 1.5 2-1.5 5-2 8.5-1.5V5C17 4.5 14 5 12 6.5z" />
      <path d="M12 6.5v13" />
      <path d="M6 9h3.5M6 12h3.5M14.5 9H18M14.5 12H18" />
    </svg>
  );
}
