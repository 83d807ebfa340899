import type { JobDetail } from '@tappet/contracts';
import { Button, FormMessage, TextField, useToast } from '@tappet/ui';
import { useRef, useState } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { jobFileHref } from '../api/get-job';
import { useUploadJobPhotos } from '../api/mutations';

/** Largest photo the web app sends; the API checks again (and re-encodes what it keeps). */
const MAX_BYTES = 15 * 1024 * 1024;

/** Photos of the job: thumbnails that open the full photo, and an upload for those who work on it. */
export function JobPhotos({ shopId, job, canUpload }: { shopId: string; job: JobDetail; canUpload: boolean }) {
  const upload = useUploadJobPhotos(shopId, job.id);
  const toast = useToast();
  const input = useRef<HTMLInputElement>(null);
  const [caption, setCaption] = useState('');
  const [error, setError] = useState<string | null>(null);
  const open = job.status !== 'done' && job.status !== 'cancelled';

  const send = (list: FileList | null) => {
    const files = Array.from(list ?? []);
    if (files.length === 0) return;
    const tooBig = files.find((f) => f.size > MAX_BYTES);
    if (tooBig) return setError(`“${tooBig.name}” is larger than 15 MB.`);
    setError(null);
    upload.mutateAsync({ files, ...(caption.trim() ? { caption: caption.trim() } : {}) }).then(
      (added) => {
        setCaption('');
        if (input.current) input.current.value = '';
        toast.show(`${added.length} photo${added.length === 1 ? '' : 's'} added to job ${job.number}.`);
      },
      (e: unknown) => setError(errorMessage(e)),
    );
  };

  return (
    <div className="flex flex-col gap-3">
      {job.files.length === 0 ? (
        <p className="text-ink-muted">No photos yet.</p>
      ) : (
        <ul className="flex flex-wrap gap-3">
          {job.files.map((f) => (
            <li key={f.id} className="flex w-36 flex-col gap-1">
              <a href={jobFileHref(shopId, job.id, f.id, 'content')} target="_blank" rel="noreferrer" aria-label={`Open photo ${f.caption ?? f.originalName}`}>
                <img src={jobFileHref(shopId, job.id, f.id)} alt={f.caption ?? f.originalName} className="h-28 w-36 rounded-md border-2 border-line object-cover" />
              </a>
              <span className="truncate text-sm text-ink-muted">{f.caption ?? f.originalName}</span>
            </li>
          ))}
        </ul>
      )}
      {canUpload && open && (
        <div className="flex flex-wrap items-end gap-2">
          <TextField label="Caption (optional)" value={caption} onChange={(e) => setCaption(e.target.value)} maxLength={200} fieldClassName="min-w-56 flex-1" />
          <input ref={input} id={`job-photos-${job.id}`} type="file" accept="image/jpeg,image/png,image/webp" multiple className="sr-only" tabIndex={-1} onChange={(e) => send(e.target.files)} aria-label="Photo files" />
          <Button variant="secondary" loading={upload.isPending} onClick={() => input.current?.click()}>
            Add photos
          </Button>
        </div>
      )}
      {error && <FormMessage>{error}</FormMessage>}
    </div>
  );
}
