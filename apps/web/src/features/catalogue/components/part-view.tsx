import type { Fitment, LineageGraphResponse, PartDetailResponse, PartLink } from '@tappet/contracts';
import { Button, ConfirmDialog, ErrorState, IconAdvise, IconOk, LoadingState, PartNumber, useToast } from '@tappet/ui';
import { lazy, Suspense, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useDeleteFitment } from '../api/delete-fitment';
import { useDeleteLink } from '../api/delete-link';
import { FitmentsTable } from './fitments-table';
import { LineageList } from './lineage-list';
import { LineagePicture } from './lineage-picture';
import { LinksTable } from './links-table';
import { PartStatusPill } from './part-badges';
import { kindWords, originWords, problemTitles, problemWords, quantityWords } from './words';

function Section({ title, id, actions, children }: { title: string; id: string; actions?: ReactNode; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="flex flex-col gap-4 rounded-lg border-2 border-line bg-surface p-5">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 id={id} className="text-lg font-bold">
          {title}
        </h2>
        {actions && <div className="flex gap-2">{actions}</div>}
      </div>
      {children}
    </section>
  );
}

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
}

// The edit dialogs (forms checked with the contracts' schemas, so zod) load when first opened:
// the part shows without them (docs/decisions/024-mobile-first-load.md).
const PartFormDialog = lazy(() => import('./part-form-dialog').then((m) => ({ default: m.PartFormDialog })));
const LinkFormDialog = lazy(() => import('./link-form-dialog').then((m) => ({ default: m.LinkFormDialog })));
const FitmentFormDialog = lazy(() => import('./fitment-form-dialog').then((m) => ({ default: m.FitmentFormDialog })));

/** Everything the shop knows about one part: details, current number, problems, lineage, links and fitment. */
export function PartView({ shopId, detail, lineage, canEdit }: PartViewProps) {
  const { part, linksFrom, linksTo, fitments, problems } = detail;
  const toast = useToast();
  const [editingPart, setEditingPart] = useState(false);
  const [linkDialog, setLinkDialog] = useState<{ link?: PartLink } | null>(null);
  const [fitmentDialog, setFitmentDialog] = useState<{ fitment?: Fitment } | null>(null);
  const [deletingLink, setDeletingLink] = useState<PartLink | null>(null);
  const [deletingFitment, setDeletingFitment] = useState<Fitment | null>(null);
  const deleteLink = useDeleteLink(shopId);
  const deleteFitment = useDeleteFitment(shopId);

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

      <Section title="Details" id="details-title">
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
      </Section>

      <Section title="Lineage" id="lineage-title">
        {lineage.isPending ? (
          <LoadingState label="Loading the lineage…" />
        ) : lineage.error || !lineage.data ? (
          <ErrorState message={errorMessage(lineage.error)} onRetry={lineage.refetch} />
        ) : (
          <div className="grid grid-cols-1 gap-6 xl:grid-cols-[minmax(0,1fr)_18rem]">
            <LineagePicture shopId={shopId} graph={lineage.data} number={part.number} />
            <div className="flex flex-col gap-2">
              <h3 className="font-bold">In words</h3>
              <LineageList shopId={shopId} graph={lineage.data} />
            </div>
          </div>
        )}
      </Section>

      <Section
        title="Links from this part"
        id="links-from-title"
        actions={
          canEdit && (
            <Button variant="secondary" size="sm" onClick={() => setLinkDialog({})}>
              Add link
            </Button>
          )
        }
      >
        <LinksTable
          shopId={shopId}
          links={linksFrom}
          direction="from"
          caption={`Links from ${part.number}`}
          emptyText="This part is not replaced by, made up of or equivalent to another part."
          onEdit={canEdit ? (link) => setLinkDialog({ link }) : undefined}
          onDelete={canEdit ? setDeletingLink : undefined}
        />
      </Section>

      <Section title="Links to this part" id="links-to-title">
        <LinksTable
          shopId={shopId}
          links={linksTo}
          direction="to"
          caption={`Links to ${part.number}`}
          emptyText="No other part points to this one. Add such a link from the other part's page."
          onEdit={canEdit ? (link) => setLinkDialog({ link }) : undefined}
          onDelete={canEdit ? setDeletingLink : undefined}
        />
      </Section>

      <Section
        title="Fitment"
        id="fitment-title"
        actions={
          canEdit && (
            <Button variant="secondary" size="sm" onClick={() => setFitmentDialog({})}>
              Add fitment
            </Button>
          )
        }
      >
        <FitmentsTable
          fitments={fitments}
          onEdit={canEdit ? (fitment) => setFitmentDialog({ fitment }) : undefined}
          onDelete={canEdit ? setDeletingFitment : undefined}
        />
      </Section>

      <Suspense fallback={null}>
        {editingPart && <PartFormDialog shopId={shopId} open onClose={() => setEditingPart(false)} part={part} />}
        {linkDialog && <LinkFormDialog shopId={shopId} open onClose={() => setLinkDialog(null)} from={part} link={linkDialog.link} />}
        {fitmentDialog && (
          <FitmentFormDialog shopId={shopId} partId={part.id} partNumber={part.number} open onClose={() => setFitmentDialog(null)} fitment={fitmentDialog.fitment} />
        )}
      </Suspense>
      <ConfirmDialog
        open={deletingLink !== null}
        destructive
        title="Delete this link?"
        message={
          deletingLink && (
            <>
              “{deletingLink.fromNumber} {kindWords[deletingLink.kind]} {deletingLink.toNumber}” will be removed, and the lineage of both numbers
              will be worked out without it. You can add it again later.
            </>
          )
        }
        confirmLabel="Delete link"
        loading={deleteLink.isPending}
        onCancel={() => setDeletingLink(null)}
        onConfirm={() => {
          if (!deletingLink) return;
          deleteLink.mutate(deletingLink.id, {
            onSuccess: () => {
              toast.show('Link deleted.', 'ok');
              setDeletingLink(null);
            },
            onError: (error) => toast.show(errorMessage(error), 'fail'),
          });
        }}
      />
      <ConfirmDialog
        open={deletingFitment !== null}
        destructive
        title="Delete this fitment?"
        message={deletingFitment && <>{part.number} will no longer be listed as fitting the {deletingFitment.marque} {deletingFitment.model}.</>}
        confirmLabel="Delete fitment"
        loading={deleteFitment.isPending}
        onCancel={() => setDeletingFitment(null)}
        onConfirm={() => {
          if (!deletingFitment) return;
          deleteFitment.mutate(deletingFitment.id, {
            onSuccess: () => {
              toast.show('Fitment deleted.', 'ok');
              setDeletingFitment(null);
            },
            onError: (error) => toast.show(errorMessage(error), 'fail'),
          });
        }}
      />
    </div>
  );
}
