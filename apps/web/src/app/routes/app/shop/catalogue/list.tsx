import type { QueryClient } from '@tanstack/react-query';
import { Button, buttonClasses } from '@tappet/ui';
import { useMemo, useState } from 'react';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { env } from '../../../../../config/env';
import { paths } from '../../../../../config/paths';
import { partsQueryOptions, useParts } from '../../../../../features/catalogue/api/get-parts';
import { exportHref } from '../../../../../features/catalogue/api/import-file';
import { CatalogueList } from '../../../../../features/catalogue/components/catalogue-list';
import { PartFormDialog } from '../../../../../features/catalogue/components/part-form-dialog';
import { ProblemsBanner } from '../../../../../features/catalogue/components/problems-banner';
import { parsePartListParams, usePartListParams } from '../../../../../features/catalogue/hooks/use-part-list-params';
import { PrintLabelsButton } from '../../../../../features/labels/components/print-labels-button';
import { useCan } from '../../../../../lib/ability';
import { useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

export const clientLoader =
  (queryClient: QueryClient) =>
  ({ params, request }: LoaderFunctionArgs) => {
    // Start the fetch without waiting for it: a filter change then shows at once (the previous
    // page stays on screen until the new one arrives) and the next choice builds on it.
    if (params.shopId) void queryClient.prefetchQuery(partsQueryOptions(params.shopId, parsePartListParams(new URL(request.url).searchParams)));
    return null;
  };

/** The catalogue: every part of the shop, filtered and paged, with add, import and export. */
export default function CatalogueListRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const navigate = useNavigate();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canCreate = useCan('create', 'Part', { shopId });
  const canImport = useCan('import', 'Part', { shopId });
  const { params, update, filtered, clear } = usePartListParams();
  // Shares the list's cache entry: only used to offer known categories in the form.
  const categories = useParts(shopId, params).data?.categories ?? [];
  const [adding, setAdding] = useState(false);
  // Parts chosen for labels, kept across pages and filters, in the order chosen.
  const [chosen, setChosen] = useState<Map<string, { id: string; number: string }>>(new Map());
  const selection = useMemo(
    () => ({
      isSelected: (id: string) => chosen.has(id),
      onChange: (rows: { id: string; number: string }[], selected: boolean) =>
        setChosen((before) => {
          const next = new Map(before);
          for (const row of rows) {
            if (selected) next.set(row.id, { id: row.id, number: row.number });
            else next.delete(row.id);
          }
          return next;
        }),
    }),
    [chosen],
  );
  useDocumentTitle(membership ? `${membership.shopName} · Catalogue` : 'Catalogue');

  if (!membership) return null;

  const addButton = canCreate && (
    <Button onClick={() => setAdding(true)}>Add part</Button>
  );
  const importLink = canImport && (
    <Link to={paths.shop.catalogueImport.getHref(shopId)} className={buttonClasses('secondary')}>
      Import
    </Link>
  );

  return (
    <>
      <PageHeader
        eyebrow={membership.shopName}
        title="Catalogue"
        description="Every number the shop has met, as printed, with how the numbers replace one another."
        actions={
          (canCreate || canImport) && (
            <>
              {addButton}
              {importLink}
            </>
          )
        }
      />
      <div className="flex flex-col gap-4">
        <ProblemsBanner shopId={shopId} showing={Boolean(params.problemsOnly)} onShow={() => update({ problemsOnly: true })} />
        {chosen.size > 0 && (
          <div role="region" aria-label="Chosen parts" className="flex flex-wrap items-center gap-3 rounded-lg border-2 border-accent bg-accent-soft px-4 py-2">
            <p className="font-bold" aria-live="polite">
              {chosen.size} {chosen.size === 1 ? 'part' : 'parts'} chosen
            </p>
            <PrintLabelsButton shopId={shopId} variant="primary" source={{ kind: 'parts', parts: [...chosen.values()] }} />
            <Button variant="ghost" onClick={() => setChosen(new Map())}>
              Clear the choice
            </Button>
          </div>
        )}
        <CatalogueList
          shopId={shopId}
          params={params}
          filtered={filtered}
          onChange={update}
          onClear={clear}
          selection={selection}
          emptyActions={
            canCreate || canImport ? (
              <div className="flex flex-wrap gap-2">
                {canCreate && <Button onClick={() => setAdding(true)}>Add a part</Button>}
                {canImport && (
                  <Link to={paths.shop.catalogueImport.getHref(shopId)} className={buttonClasses('secondary')}>
                    Import a file
                  </Link>
                )}
              </div>
            ) : undefined
          }
        />
        <p className="flex flex-wrap items-center gap-x-4 gap-y-1 text-ink-muted">
          <span>Download as CSV:</span>
          <a href={exportHref(env.apiBaseUrl, shopId, 'parts')} download className="text-accent underline underline-offset-4">
            parts
          </a>
          <a href={exportHref(env.apiBaseUrl, shopId, 'links')} download className="text-accent underline underline-offset-4">
            links
          </a>
          <a href={exportHref(env.apiBaseUrl, shopId, 'fitments')} download className="text-accent underline underline-offset-4">
            fitments
          </a>
        </p>
      </div>
      {adding && (
        <PartFormDialog
          shopId={shopId}
          open
          onClose={() => setAdding(false)}
          categories={categories}
          onSaved={(part) => navigate(paths.shop.part.getHref(shopId, part.id))}
        />
      )}
    </>
  );
}
