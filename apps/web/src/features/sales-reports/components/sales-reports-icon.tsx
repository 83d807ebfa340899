import type { SVGProps } from 'react';

/** Three bars on a base line: sales reports in the rail. Decorative (the rail names it in words). */
export function IconSalesReports({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <path d="M3 21h18" />
      <path d="M6 17v-6M11 17V7M16 17v-9M20 17v-4" />
    </svg>
  );
}
