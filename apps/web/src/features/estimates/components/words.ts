import type { EstimateStatus } from '@tappet/contracts';
import { formatDate } from '../../../lib/dates';

export const estimateStatusWords: Record<EstimateStatus, string> = {
  draft: 'Draft',
  sent: 'Waiting for the customer',
  approved: 'Approved',
  declined: 'Declined',
  superseded: 'Replaced by a newer version',
};

/** A calendar date for people, from an ISO time. */
export const dateOf = (iso: string | null) => (iso ? formatDate(iso) : '');
