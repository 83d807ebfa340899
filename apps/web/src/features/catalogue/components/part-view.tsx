import type { LineageGraphResponse, PartDetailResponse } from '@tappet/contracts';
import { Button, IconAdvise, IconOk, LoadingState, Panel, PartNumber } from '@tappet/ui';
import { lazy, Suspense, useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { PartStatusPill } from './part-badges';
import { originWords, problemTitles, problemWords, quantityWords } from './words';

/** "Current orderable number: …", or why there is none. */
export function CurrentParts({ shopId, detail }: { shopId: string; detail: PartDetailResponse }) {
  const { part, current, problems } = detail;
  // A dead end's current "part" is the last number of the line, which nobody sells any more.
  const deadEnd = new Set(problems.filter((p) => p.kind === 'dead_end').flatMap((p) => p.numbers));
  if (current.length === 1 && (current[0]?.partId === part.id || current[0]?.number === part.number)) {
    if (part.status === 'nla') {
      return (
        <p className="flex items-center gap-2 rounded-md border-2 border-advise bg-advise-soft p-3">
          <IconAdvise className="shrink-0 text-advise" />
          <span className="font-bold">This is the newest number of its line, but it is no longer available, and nothing replaces it.</span>
        </p>
      );
    }
    return (
      <p className="flex items-center gap-2 rounded-md border-2 border-ok bg-ok-soft p-3">
        <IconOk className="shrink-0 text-ok" />
        <span>
          <span className="font-bold">This is the current orderable number.</span>
        </span>
      </p>
    );
  }
  if (current.length === 0) {
    return (
      <p className="flex items-center gap-2 rounded-md border-2 border-advise bg-advise-soft p-3">
        <IconAdvise className="shrink-0 text-advise" />
        <span className="font-bold">No current orderable number: this line ends without an available part.</span>
      </p>
    );
  }
  return (
    <div className="flex items-start gap-2 rounded-md border-2 border-accent bg-accent-soft p-3">
      <IconOk className="mt-1 shrink-0 text-accent" />
      <p>
        <span className="font-bold">{current.length === 1 ? 'Current orderable number: ' : 'Current orderable numbers, needed together: '}</span>
        {current.map((c, i) => (
          <span key={`${c.number}-${i}`}>
            {i > 0 && ', '}
            {c.partId ? (
              <Link to={paths.shop.part.getHref(shopId, c.partId)} className="text-accent underline underline-offset-4">
                <PartNumber>{c.number}</PartNumber>
              </Link>
            ) : (
              <PartNumber>{c.number}</PartNumber>
            )}
            {(current.length > 1 || c.quantity !== 1) && <span className="font-mono tabular"> {quantityWords(c.quantity)}</span>}
            {deadEnd.has(c.number) && <span className="font-bold text-advise"> (no longer available)</span>}
          </span>
        ))}
      </p>
    </div>
  );
}

export interface PartViewProps {
  shopId: string;
  detail: PartDetailResponse;
  lineage: { data?: LineageGraphResponse; isPending: boolean; error: unknown; refetch: () => void };
  canEdit: boolean;
  /** False until the part has been painted: the sections below (and their code) wait for it. */
  showSections: boolean;
}

// The edit form (checked with the contracts' schemas, so zod) loads when first opened: the part
// shows without it (docs/decisions/024-mobile-first-load.md).
const PartFormDialog = lazy(() => import('./part-form-dialog').then((m) => ({ default: m.PartFormDialog })));
// The sections below the details (the lineage picture, the tables and their forms) are most of the
// page's code and rendering work: they load once the part's number, current number and details are
// on screen (docs/decisions/026-first-screen-requests.md).
const PartSections = lazy(() => import('./part-sections').then((m) => ({ default: m.PartSections })));
const sectionsLoading = <LoadingState label="Loading the lineage, links and fitment…" />;

/** Everything the shop knows about one part: details, current number, problems, lineage, links and fitment. */
export function PartView({ shopId, detail, lineage, canEdit, showSections }: PartViewProps) {
  const { part, problems } = detail;
  const [editingPart, setEditingPart] = useState(false);

  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-col gap-3">
        <div className="flex flex-wrap items-center gap-3">
          <PartStatusPill status={part.status} />
          <span className="text-ink-muted">{originWords[part.origin]}</span>
          {canEdit && (
            <Button variant="secondary" size="sm" onClick={() => setEditingPart(true)}>
              Edit part
            </Button>
          )}
        </div>
        <CurrentParts shopId={shopId} detail={detail} />
        {problems.length > 0 && (
          <div role="region" aria-labelledby="problems-title" className="flex flex-col gap-2 rounded-md border-2 border-advise bg-advise-soft p-3">
            <h2 id="problems-title" className="flex items-center gap-2 font-bold">
              <IconAdvise className="text-advise" />
              {problems.length === 1 ? 'A data problem touches this part' : `${problems.length} data problems touch this part`}
            </h2>
            <ul className="flex list-disc flex-col gap-1 pl-6">
              {problems.map((p, i) => (
                <li key={i}>
                  <span className="font-bold">{problemTitles[p.kind]}: </span>
                  {problemWords(p)}
                </li>
              ))}
            </ul>
          </div>
        )}
      </div>

      <Panel title="Details" id="details-title">
        <dl className="grid grid-cols-1 gap-x-6 gap-y-3 sm:grid-cols-[max-content_1fr]">
          <dt className="font-bold">Number as printed</dt>
          <dd>
            <PartNumber>{part.number}</PartNumber>
          </dd>
          <dt className="font-bold">Description</dt>
          <dd>{part.description}</dd>
          <dt className="font-bold">Origin</dt>
          <dd>{originWords[part.origin]}</dd>
          <dt className="font-bold">Maker</dt>
          <dd>{part.maker ?? <span className="text-ink-muted">Not recorded</span>}</dd>
          <dt className="font-bold">Category</dt>
          <dd>{part.category ?? <span className="text-ink-muted">None</span>}</dd>
          <dt className="font-bold">Unit</dt>
          <dd>{part.unit}</dd>
          <dt className="font-bold">Supplier numbers</dt>
          <dd>
            {part.supplierNumbers.length === 0 ? (
              <span className="text-ink-muted">None recorded</span>
            ) : (
              <ul className="flex flex-wrap gap-x-4 gap-y-1">
                {part.supplierNumbers.map((n) => (
                  <li key={n}>
                    <PartNumber>{n}</PartNumber>
                  </li>
                ))}
              </ul>
            )}
          </dd>
          {part.notes && (
            <>
              <dt className="font-bold">Notes</dt>
              <dd className="whitespace-pre-line">{part.notes}</dd>
            </>
          )}
        </dl>
      </Panel>

      {showSections ? (
        <Suspense fallback={sectionsLoading}>
          <PartSections shopId={shopId} detail={detail} lineage={lineage} canEdit={canEdit} />
        </Suspense>
      ) : (
        sectionsLoading
      )}
      <Suspense fallback={null}>{editingPart && <PartFormDialog shopId={shopId} open onClose={() => setEditingPart(false)} part={part} />}</Suspense>
    </div>
  );
}
