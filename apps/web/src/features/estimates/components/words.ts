import type { EstimateStatus } from '@tappet/contracts';

export const estimateStatusWords: Record<EstimateStatus, string> = {
  draft: 'Draft',
  sent: 'Waiting for the customer',
  approved: 'Approved',
  declined: 'Declined',
  superseded: 'Replaced by a newer version',
};

/** A calendar date for people, from an ISO time. */
export const dateOf = (iso: string | null) => (iso ? new Date(iso).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' }) : '');
