import { jobListLimit, type JobSummary } from '@tappet/contracts';
import { EmptyState, ErrorState, LoadingState } from '@tappet/ui';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useJobs, type JobListParams } from '../api/get-jobs';
import { JobStatusBadge } from './job-status-badge';
import { boardColumns, jobStatusWords, vehicleLine } from './words';

/** One job as a card: number, title, vehicle, people, checklist progress and safety blockers. */
function JobCard({ shopId, job }: { shopId: string; job: JobSummary }) {
  return (
    <li className="rounded-md border-2 border-line bg-surface">
      <Link to={paths.shop.job.getHref(shopId, job.id)} className="block min-h-touch p-4 hover:bg-sunk focus-visible:outline-2 focus-visible:outline-accent">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <span className="font-mono text-lg font-bold">Job {job.number}</span>
          <JobStatusBadge status={job.status} />
        </div>
        <p className="mt-1 font-bold">{job.title}</p>
        <p className="text-ink-muted">
          {vehicleLine(job.vehicle)}
          {job.vehicle.frameNumber && <span className="ml-2 font-mono text-ink">{job.vehicle.frameNumber}</span>}
        </p>
        <p className="mt-2 text-sm text-ink-muted">
          {job.assignees.length ? job.assignees.map((a) => a.name).join(', ') : 'Nobody assigned'}
          {job.progress.total > 0 && (
            <span className="ml-2">
              · Checklist {job.progress.recorded}/{job.progress.total}
            </span>
          )}
          {job.dueOn && <span className="ml-2">· Due {job.dueOn}</span>}
        </p>
        {job.blockerCount > 0 && (
          <p className="mt-2 text-sm font-bold text-fail">
            {job.blockerCount} safety item{job.blockerCount === 1 ? '' : 's'} failed or not recorded
          </p>
        )}
      </Link>
    </li>
  );
}

/**
 * Jobs grouped by status: the owner's board of every job, or a mechanic's own jobs. Groups stack
 * in one column on a tablet and sit side by side on a wide screen.
 */
export function JobBoard({ shopId, params, emptyHint }: { shopId: string; params: JobListParams; emptyHint: string }) {
  const jobs = useJobs(shopId, params);
  if (jobs.isPending) return <LoadingState label="Loading jobs…" />;
  if (jobs.isError) return <ErrorState message={errorMessage(jobs.error)} onRetry={() => void jobs.refetch()} />;
  const list = jobs.data.jobs;
  if (list.length === 0) return <EmptyState title="No jobs here yet">{emptyHint}</EmptyState>;
  const columns = boardColumns.filter((s) => list.some((j) => j.status === s));
  return (
    <>
      {jobs.data.truncated && (
        <p role="status" className="mb-4 rounded-md border-2 border-advise bg-advise-soft p-3">
          Showing the newest {jobListLimit} jobs. Older ones are on their vehicles’ pages{params.closed ? ', or hide the done and cancelled jobs to see fewer' : ''}.
        </p>
      )}
      <div className="grid gap-6 xl:grid-cols-3">
        {columns.map((status) => {
          const inColumn = list.filter((j) => j.status === status);
          return (
            <section key={status} aria-labelledby={`jobs-${status}`}>
              <h2 id={`jobs-${status}`} className="mb-2 text-lg font-bold">
                {jobStatusWords[status]} <span className="text-ink-muted">({inColumn.length})</span>
              </h2>
              <ul className="flex flex-col gap-3">
                {inColumn.map((job) => (
                  <JobCard key={job.id} shopId={shopId} job={job} />
                ))}
              </ul>
            </section>
          );
        })}
      </div>
    </>
  );
}
