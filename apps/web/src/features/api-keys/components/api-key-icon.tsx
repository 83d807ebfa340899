import type { SVGProps } from 'react';

/** A key: API keys in the rail. Decorative. */
export function IconApiKey({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <circle cx="7.5" cy="15.5" r="4" />
      <path d="m10.5 12.5 9-9M16 7l2.5 2.5M18.5 4.5 21 7" />
    </svg>
  );
}
