import type { SVGProps } from 'react';

type IconProps = SVGProps<SVGSVGElement> & { size?: number };

/** A ledger page with a stamped total: the shop's billing in the rail. Decorative. */
export function IconBilling({ size = 20, ...rest }: IconProps) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <path d="M6 3h9l3 3v15H6z" />
      <path d="M9 9h6M9 13h6" />
      <path d="M9 17h3" />
    </svg>
  );
}

/** A hand-held lamp: support looking in, in the rail. Decorative. */
export function IconSupport({ size = 20, ...rest }: IconProps) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <path d="M9 3h6l-1 6h-4z" />
      <path d="M10 9v4a2 2 0 0 0 4 0V9" />
      <path d="M12 15v6" />
      <path d="M5 7l2 1M19 7l-2 1" />
    </svg>
  );
}
