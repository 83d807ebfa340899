import type { SVGProps } from 'react';

/** A ruled ledger page with a tick: the audit log in the rail. Decorative. */
export function IconAuditLog({ size = 20, ...rest }: SVGProps<SVGSVGElement> & { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke="currentColor" strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false" {...rest}>
      <rect x="4" y="3" width="16" height="18" rx="1.5" />
      <path d="M8 8h8M8 12h8M8 16h3" />
      <path d="m13.5 16.5 1.5 1.5 3-3" />
    </svg>
  );
}
