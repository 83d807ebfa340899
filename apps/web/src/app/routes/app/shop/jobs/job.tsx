import type { QueryClient } from '@tanstack/react-query';
import type { PressureUnit } from '@tappet/domain';
import { ErrorState, LoadingState } from '@tappet/ui';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { NotFoundContent } from '../../../../../components/errors/not-found';
import { paths } from '../../../../../config/paths';
import { jobQueryOptions, useJob } from '../../../../../features/jobs/api/get-job';
import { JobView } from '../../../../../features/jobs/components/job-view';
import { InvoiceFromJobButton } from '../../../../../features/sales/components/invoice-from-job-button';
import { EstimatePanel } from '../../../../../features/estimates/components/estimate-panel';
import { useCan } from '../../../../../lib/ability';
import { ApiError, errorMessage } from '../../../../../lib/api-client';
import { useMe } from '../../../../../lib/auth';
import { useFormatMoney, useSettings } from '../../../../../lib/shop-settings';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

export const clientLoader =
  (queryClient: QueryClient) =>
  ({ params }: LoaderFunctionArgs) => {
    if (params.shopId && params.jobId) void queryClient.prefetchQuery(jobQueryOptions(params.shopId, params.jobId));
    return null;
  };

/** One job: filled in at the bench on a tablet, read at the desk. */
export default function JobRoute() {
  const { shopId = '', jobId = '' } = useParams();
  const job = useJob(shopId, jobId);
  const me = useMe();
  const settings = useSettings(shopId);
  const formatMoney = useFormatMoney(shopId);
  const assigneeIds = job.data?.assignees.map((a) => a.id) ?? [];
  // The same CASL rules as the API: a mechanic works only on jobs assigned to them.
  const work = useCan('update', 'Job', { shopId, assigneeIds });
  const holdJob = useCan('hold', 'Job', { shopId, assigneeIds });
  const holdStock = useCan('hold', 'Stock', { shopId });
  const issueJob = useCan('issue', 'Job', { shopId, assigneeIds });
  const issueStock = useCan('issue', 'Stock', { shopId });
  const signOff = useCan('signOff', 'Job', { shopId, assigneeIds });
  const assign = useCan('create', 'Job', { shopId });
  const can = { work, hold: holdJob && holdStock, issue: issueJob && issueStock, signOff, assign };
  // Sales (issue 12): those who may invoice get a button that drafts the job's invoice.
  const invoice = useCan('create', 'Invoice', { shopId });
  useDocumentTitle(job.data ? `Job ${job.data.number} · ${job.data.title}` : 'Job');

  if (job.isPending) return <LoadingState label="Loading the job…" />;
  if (job.isError) {
    if (job.error instanceof ApiError && job.error.status === 404) return <NotFoundContent what="job" />;
    return <ErrorState message={errorMessage(job.error)} onRetry={() => void job.refetch()} />;
  }
  const j = job.data;
  return (
    <>
      <div className="mb-6">
        <nav aria-label="Breadcrumb" className="text-sm font-bold tracking-wide text-ink-muted uppercase">
          <Link to={paths.shop.jobs.getHref(shopId)} className="text-accent underline underline-offset-4">
            Jobs
          </Link>
        </nav>
        <div className="flex flex-wrap items-end justify-between gap-4">
          <h1 className="text-xl font-bold">
            <span className="font-mono">Job {j.number}</span> · {j.title}
          </h1>
          {invoice && <InvoiceFromJobButton shopId={shopId} jobId={j.id} />}
        </div>
      </div>
      <JobView shopId={shopId} job={j} can={can} pressureUnit={(settings.data?.pressureUnit ?? 'psi') as PressureUnit} meId={me?.user.id ?? null} formatMoney={formatMoney} />
      <EstimatePanel shopId={shopId} jobId={j.id} assigneeIds={assigneeIds} />
    </>
  );
}
