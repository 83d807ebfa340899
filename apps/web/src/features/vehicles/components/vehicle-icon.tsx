import type { SVGProps } from 'react';

/** A motorcycle in profile: vehicles in the rail. Decorative (the rail names it in words). */
export function IconVehicles({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <circle cx="5.5" cy="16.5" r="3.5" />
      <circle cx="18.5" cy="16.5" r="3.5" />
      <path d="M5.5 16.5 9 10h5l2.5 6.5" />
      <path d="M14 10l1.5-3H18" />
      <path d="M9 10 7.5 7H5" />
    </svg>
  );
}
