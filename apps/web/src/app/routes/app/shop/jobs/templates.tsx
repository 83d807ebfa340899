import type { QueryClient } from '@tanstack/react-query';
import type { ChecklistTemplate } from '@tappet/contracts';
import { Button, EmptyState, ErrorState, LoadingState } from '@tappet/ui';
import { useState } from 'react';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { paths } from '../../../../../config/paths';
import { templatesQueryOptions, useTemplates } from '../../../../../features/jobs/api/get-templates';
import { TemplateEditor } from '../../../../../features/jobs/components/template-editor';
import { useCan } from '../../../../../lib/ability';
import { errorMessage } from '../../../../../lib/api-client';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

export const clientLoader =
  (queryClient: QueryClient) =>
  ({ params }: LoaderFunctionArgs) => {
    if (params.shopId) void queryClient.prefetchQuery(templatesQueryOptions(params.shopId));
    return null;
  };

/** The shop's checklist templates; the owner edits them. */
export default function ChecklistTemplatesRoute() {
  const { shopId = '' } = useParams();
  const templates = useTemplates(shopId);
  const canEdit = useCan('update', 'Settings', { shopId });
  const [editing, setEditing] = useState<ChecklistTemplate | 'new' | null>(null);
  useDocumentTitle('Checklist templates');
  return (
    <>
      <nav aria-label="Breadcrumb" className="text-sm font-bold tracking-wide text-ink-muted uppercase">
        <Link to={paths.shop.jobs.getHref(shopId)} className="text-accent underline underline-offset-4">
          Jobs
        </Link>
      </nav>
      <PageHeader
        title="Checklist templates"
        description="A checklist started on a job copies its template's items, so changing a template never changes a checklist already filled in."
        actions={canEdit && editing === null ? <Button onClick={() => setEditing('new')}>New template</Button> : undefined}
      />
      {editing !== null && (
        <section aria-label={editing === 'new' ? 'New template' : `Editing ${editing.name}`} className="mb-6 rounded-md border-2 border-accent bg-surface p-4">
          <TemplateEditor shopId={shopId} template={editing === 'new' ? null : editing} onDone={() => setEditing(null)} />
        </section>
      )}
      {templates.isPending && <LoadingState label="Loading templates…" />}
      {templates.isError && <ErrorState message={errorMessage(templates.error)} onRetry={() => void templates.refetch()} />}
      {templates.data && templates.data.templates.length === 0 && <EmptyState title="No templates">Create one with “New template”.</EmptyState>}
      {templates.data && (
        <ul className="flex flex-col gap-3">
          {templates.data.templates.map((t) => (
            <li key={t.id} className="flex flex-wrap items-center justify-between gap-2 rounded-md border-2 border-line bg-surface p-4">
              <div>
                <h2 className="font-bold">
                  {t.name} {t.archived && <span className="text-ink-muted">(archived)</span>}
                </h2>
                <p className="text-sm text-ink-muted">
                  {t.items.length} items, {t.items.filter((i) => i.safety).length} safety-critical. {t.description}
                </p>
              </div>
              {canEdit && editing === null && (
                <Button variant="secondary" onClick={() => setEditing(t)} aria-label={`Edit ${t.name}`}>
                  Edit
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
