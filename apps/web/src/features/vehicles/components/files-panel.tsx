import type { VehicleDetail, VehicleFile } from '@tappet/contracts';
import { Button, ConfirmDialog, EmptyState, FormMessage, TextField, useToast } from '@tappet/ui';
import { useRef, useState, type FormEvent } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { fileHref } from '../api/get-vehicle';
import { useDeleteVehicleFile, useUploadVehicleFiles } from '../api/mutations';
import { formatBytes } from './words';

/** Largest file and most files the API takes (apps/api uploads module). */
export const uploadLimits = { maxFileBytes: 15 * 1024 * 1024, maxFiles: 10 };
const accepted = 'image/jpeg,image/png,image/webp,application/pdf';

/** Checks a choice of files before sending, with the same limits as the API; null when fine. */
export function checkFiles(files: File[]): string | null {
  if (files.length === 0) return 'Choose at least one photo or PDF.';
  if (files.length > uploadLimits.maxFiles) return `Upload at most ${uploadLimits.maxFiles} files at a time.`;
  const big = files.find((f) => f.size > uploadLimits.maxFileBytes);
  if (big) return `“${big.name}” is larger than 15 MB. Upload a smaller file (scan documents at 200–300 dpi).`;
  return null;
}

/** Upload form: photos and PDF documents; the API checks each by its content and keeps none if one fails. */
function UploadForm({ shopId, vehicleId }: { shopId: string; vehicleId: string }) {
  const input = useRef<HTMLInputElement>(null);
  const upload = useUploadVehicleFiles(shopId, vehicleId);
  const toast = useToast();
  const [problem, setProblem] = useState<string | null>(null);
  const [caption, setCaption] = useState('');

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    const files = Array.from(input.current?.files ?? []);
    const local = checkFiles(files);
    setProblem(local);
    if (local) return;
    upload.mutate(
      { files, caption: caption || undefined },
      {
        onSuccess: (saved) => {
          toast.show(saved.length === 1 ? `Added ${saved[0]?.originalName ?? 'the file'}.` : `Added ${saved.length} files.`, 'ok');
          if (input.current) input.current.value = '';
          setCaption('');
        },
        onError: (error) => setProblem(errorMessage(error)),
      },
    );
  }

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-3 rounded-md bg-sunk p-3" aria-label="Add photos and documents">
      {problem && <FormMessage>{problem}</FormMessage>}
      <div className="grid grid-cols-1 items-end gap-3 sm:grid-cols-[1fr_1fr_auto]">
        <label className="flex flex-col gap-1">
          <span className="font-bold">Photos or PDFs</span>
          <input ref={input} type="file" name="files" multiple accept={accepted} className="min-h-touch" />
          <span className="text-sm text-ink-muted">JPEG, PNG, WebP or PDF; up to 10 files of 15 MB. Location data is removed from photos.</span>
        </label>
        <TextField label="Caption" value={caption} onChange={(e) => setCaption(e.currentTarget.value)} hint="Optional, for all files in this upload." maxLength={200} autoComplete="off" />
        <Button type="submit" loading={upload.isPending}>
          Upload
        </Button>
      </div>
    </form>
  );
}

/** Photos as a gallery of thumbnails (each opens the full photo) and documents as a list, with upload and remove. */
export function FilesPanel({ shopId, vehicle, canEdit }: { shopId: string; vehicle: VehicleDetail; canEdit: boolean }) {
  const photos = vehicle.files.filter((f) => f.kind === 'photo');
  const documents = vehicle.files.filter((f) => f.kind === 'document');
  const remove = useDeleteVehicleFile(shopId, vehicle.id);
  const [removing, setRemoving] = useState<VehicleFile | null>(null);
  const toast = useToast();

  return (
    <>
      <section aria-labelledby="photos-heading" className="flex flex-col gap-3">
        <h2 id="photos-heading" className="text-lg font-bold">
          Photos <span className="font-normal text-ink-muted">({photos.length})</span>
        </h2>
        {photos.length === 0 ? (
          <EmptyState title="No photos yet">{canEdit ? 'Add photos of the vehicle as it arrived, its numbers and its faults.' : 'Photos appear here once someone adds them.'}</EmptyState>
        ) : (
          <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" aria-label="Photo gallery">
            {photos.map((p) => (
              <li key={p.id} className="flex flex-col gap-1 rounded-md border border-line bg-surface p-2">
                <a href={fileHref(shopId, vehicle.id, p.id)} target="_blank" rel="noopener" className="block overflow-hidden rounded-sm focus-visible:outline-2">
                  <img src={fileHref(shopId, vehicle.id, p.id, 'thumbnail')} alt={p.caption ?? p.originalName} loading="lazy" className="aspect-[4/3] w-full bg-sunk object-cover" />
                </a>
                <span className="truncate text-sm" title={p.originalName}>
                  {p.caption ?? p.originalName}
                </span>
                {canEdit && (
                  <Button variant="secondary" size="sm" onClick={() => setRemoving(p)}>
                    Remove<span className="sr-only"> {p.originalName}</span>
                  </Button>
                )}
              </li>
            ))}
          </ul>
        )}
      </section>
      <section aria-labelledby="documents-heading" className="flex flex-col gap-3">
        <h2 id="documents-heading" className="text-lg font-bold">
          Documents <span className="font-normal text-ink-muted">({documents.length})</span>
        </h2>
        {documents.length === 0 ? (
          <p className="text-ink-muted">No documents yet: certificates, invoices and earlier service records go here as PDFs.</p>
        ) : (
          <ul className="flex flex-col divide-y divide-line rounded-md border border-line bg-surface">
            {documents.map((d) => (
              <li key={d.id} className="flex flex-wrap items-center justify-between gap-2 p-3">
                <span className="flex flex-col">
                  <a href={fileHref(shopId, vehicle.id, d.id, 'download')} className="font-bold text-accent underline underline-offset-4">
                    {d.originalName}
                  </a>
                  <span className="text-sm text-ink-muted">
                    PDF, {formatBytes(d.byteSize)}
                    {d.caption ? ` · ${d.caption}` : ''}
                    {d.uploadedBy ? ` · added by ${d.uploadedBy.name}` : ''}
                  </span>
                </span>
                {canEdit && (
                  <Button variant="secondary" size="sm" onClick={() => setRemoving(d)}>
                    Remove<span className="sr-only"> {d.originalName}</span>
                  </Button>
                )}
              </li>
            ))}
          </ul>
        )}
        {canEdit && <UploadForm shopId={shopId} vehicleId={vehicle.id} />}
      </section>
      <ConfirmDialog
        open={removing !== null}
        onCancel={() => setRemoving(null)}
        onConfirm={() => {
          if (!removing) return;
          remove.mutate(removing.id, {
            onSuccess: () => {
              toast.show(`Removed ${removing.originalName}.`, 'ok');
              setRemoving(null);
            },
            onError: (e) => toast.show(errorMessage(e), 'fail'),
          });
        }}
        title="Remove this file?"
        message={removing ? `“${removing.originalName}” will be deleted for everyone in the shop. This cannot be undone.` : ''}
        confirmLabel="Remove file"
        destructive
        loading={remove.isPending}
      />
    </>
  );
}
