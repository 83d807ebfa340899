import type { QueryClient } from '@tanstack/react-query';
import { Button, cn } from '@tappet/ui';
import { useState } from 'react';
import { Link, useNavigate, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { paths } from '../../../../../config/paths';
import { jobsQueryOptions } from '../../../../../features/jobs/api/get-jobs';
import { JobBoard } from '../../../../../features/jobs/components/job-board';
import { NewJobDialog } from '../../../../../features/jobs/components/new-job-dialog';
import { useCan } from '../../../../../lib/ability';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

/** `?view=mine` for the caller's own jobs (the default for a mechanic's link), else the board. */
function paramsFrom(search: URLSearchParams) {
  return { mine: search.get('view') === 'mine', closed: search.get('closed') === 'true' };
}

export const clientLoader =
  (queryClient: QueryClient) =>
  ({ params, request }: LoaderFunctionArgs) => {
    if (params.shopId) void queryClient.prefetchQuery(jobsQueryOptions(params.shopId, paramsFrom(new URL(request.url).searchParams)));
    return null;
  };

/** Jobs: "My jobs" for the person signed in, or the board of every job in the shop. */
export default function JobsRoute() {
  const { shopId = '' } = useParams();
  const [search] = useSearchParams();
  const navigate = useNavigate();
  const params = paramsFrom(search);
  const canCreate = useCan('create', 'Job', { shopId });
  const canEditTemplates = useCan('update', 'Settings', { shopId });
  const [creating, setCreating] = useState(false);
  useDocumentTitle(params.mine ? 'My jobs' : 'Jobs');
  const tab = (mine: boolean, label: string) => (
    <Link
      to={paths.shop.jobs.getHref(shopId, mine ? 'view=mine' : undefined)}
      aria-current={params.mine === mine ? 'page' : undefined}
      className={cn('inline-flex min-h-touch items-center rounded-md border-2 px-4 font-bold', params.mine === mine ? 'border-accent bg-accent-soft text-accent' : 'border-line-strong')}
    >
      {label}
    </Link>
  );
  return (
    <>
      <PageHeader
        title={params.mine ? 'My jobs' : 'Jobs'}
        description="Work on vehicles: what the customer asked for, who is on it, checklists, parts and labour."
        actions={
          <>
            {canEditTemplates && (
              <Link to={paths.shop.checklistTemplates.getHref(shopId)} className="inline-flex min-h-touch items-center rounded-md border-2 border-line-strong px-4 font-bold">
                Checklist templates
              </Link>
            )}
            {canCreate && <Button onClick={() => setCreating(true)}>New job</Button>}
          </>
        }
      />
      <nav aria-label="Which jobs" className="mb-4 flex flex-wrap gap-2">
        {tab(true, 'My jobs')}
        {tab(false, 'All jobs')}
        <Link
          to={paths.shop.jobs.getHref(shopId, [params.mine ? 'view=mine' : '', params.closed ? '' : 'closed=true'].filter(Boolean).join('&'))}
          className="inline-flex min-h-touch items-center px-2 text-accent underline underline-offset-4"
        >
          {params.closed ? 'Hide done and cancelled' : 'Show done and cancelled'}
        </Link>
      </nav>
      <JobBoard shopId={shopId} params={params} emptyHint={params.mine ? 'Jobs assigned to you show here.' : canCreate ? 'Open a job on a vehicle with “New job”.' : 'Jobs the owner opens show here.'} />
      {creating && <NewJobDialog shopId={shopId} open onClose={() => setCreating(false)} onCreated={(id) => navigate(paths.shop.job.getHref(shopId, id))} />}
    </>
  );
}
