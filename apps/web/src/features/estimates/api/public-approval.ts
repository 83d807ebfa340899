import type { PublicEstimate, PublicEstimateDecision } from '@tappet/contracts';
import { api } from '../../../lib/api-client';

// The customer's side of an e-mailed estimate: no account, the token from the link's fragment is
// sent in the body (never in a path), so neither the page's nor the API's logs see it.

export const viewApproval = (token: string) => api.post<PublicEstimate>('/estimate-approval/view', { token });
export const approveEstimate = (input: { token: string; version: number; grossMinor: number; name: string }) => api.post<PublicEstimateDecision>('/estimate-approval/approve', input);
export const declineEstimate = (input: { token: string; reason: string }) => api.post<PublicEstimateDecision>('/estimate-approval/decline', input);
