import type { Fitment, LineageGraphResponse, PartDetailResponse, PartLink } from '@tappet/contracts';
import { Button, ConfirmDialog, ErrorState, LoadingState, Panel, useToast } from '@tappet/ui';
import { lazy, Suspense, useState } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { useDeleteFitment } from '../api/delete-fitment';
import { useDeleteLink } from '../api/delete-link';
import { FitmentsTable } from './fitments-table';
import { LineageList } from './lineage-list';
import { LineagePicture } from './lineage-picture';
import { LinksTable } from './links-table';
import { kindWords } from './words';

// The link and fitment forms (checked with the contracts' schemas, so zod) load when first opened.
const LinkFormDialog = lazy(() => import('./link-form-dialog').then((m) => ({ default: m.LinkFormDialog })));
const FitmentFormDialog = lazy(() => import('./fitment-form-dialog').then((m) => ({ default: m.FitmentFormDialog })));

export interface PartSectionsProps {
  shopId: string;
  detail: PartDetailResponse;
  lineage: { data?: LineageGraphResponse; isPending: boolean; error: unknown; refetch: () => void };
  canEdit: boolean;
}

/**
 * The part page below its details: the lineage (picture and words), the links from and to the
 * part, and its fitment, with their forms. Loaded on its own after the part's first paint
 * (part-view.tsx; docs/decisions/026-first-screen-requests.md).
 */
export function PartSections({ shopId, detail, lineage, canEdit }: PartSectionsProps) {
  const { part, linksFrom, linksTo, fitments } = detail;
  const toast = useToast();
  const [linkDialog, setLinkDialog] = useState<{ link?: PartLink } | null>(null);
  const [fitmentDialog, setFitmentDialog] = useState<{ fitment?: Fitment } | null>(null);
  const [deletingLink, setDeletingLink] = useState<PartLink | null>(null);
  const [deletingFitment, setDeletingFitment] = useState<Fitment | null>(null);
  const deleteLink = useDeleteLink(shopId);
  const deleteFitment = useDeleteFitment(shopId);

  return (
    <>
      <Panel title="Lineage" id="lineage-title">
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
      </Panel>

      <Panel
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
      </Panel>

      <Panel title="Links to this part" id="links-to-title">
        <LinksTable
          shopId={shopId}
          links={linksTo}
          direction="to"
          caption={`Links to ${part.number}`}
          emptyText="No other part points to this one. Add such a link from the other part's page."
          onEdit={canEdit ? (link) => setLinkDialog({ link }) : undefined}
          onDelete={canEdit ? setDeletingLink : undefined}
        />
      </Panel>

      <Panel
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
      </Panel>

      <Suspense fallback={null}>
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
    </>
  );
}
