import type { JobStatus } from '@tappet/contracts';
import { Badge } from '@tappet/ui';
import { jobStatusWords } from './words';

/** A job's status as a word in a neutral badge (accent while work is under way). */
export function JobStatusBadge({ status }: { status: JobStatus }) {
  return <Badge tone={status === 'in_progress' || status === 'waiting_parts' ? 'accent' : 'neutral'}>{jobStatusWords[status]}</Badge>;
}
