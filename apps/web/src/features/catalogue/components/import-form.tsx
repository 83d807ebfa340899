import { importKinds, type ImportResult } from '@tappet/contracts';
import { Button, FormField, FormMessage, inputClasses, Num, Spinner, StatusPill } from '@tappet/ui';
import { useId, useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useImportFile, type ImportKind, type ImportMode, type UploadProgress } from '../api/import-file';
import { countWords } from './words';

/** The columns of each file, as the import expects them (header row first, any order). */
export const importColumns: Record<ImportKind, { required: string[]; optional: string[]; what: string }> = {
  parts: {
    what: 'Parts',
    required: ['number', 'description'],
    optional: ['origin', 'maker', 'category', 'unit', 'status', 'supplier_numbers', 'notes'],
  },
  links: {
    what: 'Links between numbers',
    required: ['from_number', 'kind', 'to_number'],
    optional: ['quantity', 'interchange', 'effective_date', 'source_reference', 'note'],
  },
  fitments: {
    what: 'Fitments',
    required: ['number', 'marque', 'model'],
    optional: ['year_from', 'year_to', 'frame_from', 'frame_to'],
  },
};

const actionWords: Record<ImportResult['sample'][number]['action'], string> = { add: 'Add', change: 'Change', same: 'Unchanged' };

/** "840 bytes", "12 KB", "3.4 MB". */
export function fileSizeWords(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} KB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

function Counts({ result }: { result: ImportResult }) {
  const items = [
    ['Rows read', result.rows],
    ['To add', result.added],
    ['To change', result.changed],
    ['Unchanged', result.unchanged],
    ['Rows with errors', new Set(result.errors.map((e) => e.row)).size],
  ] as const;
  return (
    <dl className="grid grid-cols-2 gap-3 sm:grid-cols-5">
      {items.map(([label, value]) => (
        <div key={label} className="rounded-md border-2 border-line bg-ground p-3">
          <dt className="text-sm text-ink-muted">{label}</dt>
          <dd className="font-mono text-lg font-bold tabular">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

function ErrorsTable({ errors }: { errors: ImportResult['errors'] }) {
  return (
    <div className="relative overflow-x-auto rounded-md border-2 border-fail">
      <table className="w-full border-collapse text-left">
        <caption className="bg-fail-soft p-3 text-left font-bold">
          {countWords(errors.length, 'problem', 'problems')} in the file. Fix these rows and check the file again; nothing has been imported.
        </caption>
        <thead className="bg-sunk">
          <tr>
            <th scope="col" className="px-3 py-2 text-right">
              Row
            </th>
            <th scope="col" className="px-3 py-2">
              Column
            </th>
            <th scope="col" className="px-3 py-2">
              Problem
            </th>
          </tr>
        </thead>
        <tbody>
          {errors.map((e, i) => (
            <tr key={i} className="border-t border-line bg-surface">
              <td className="px-3 py-2 text-right">
                <Num>{e.row}</Num>
              </td>
              <td className="px-3 py-2 font-mono">{e.column ?? '—'}</td>
              <td className="px-3 py-2">{e.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function SampleTable({ sample }: { sample: ImportResult['sample'] }) {
  if (sample.length === 0) return null;
  return (
    <div className="relative overflow-x-auto rounded-md border-2 border-line">
      <table className="w-full border-collapse text-left">
        <caption className="p-3 text-left font-bold">The first rows, as they would be imported</caption>
        <thead className="bg-sunk">
          <tr>
            <th scope="col" className="px-3 py-2 text-right">
              Row
            </th>
            <th scope="col" className="px-3 py-2">
              What happens
            </th>
            <th scope="col" className="px-3 py-2">
              Row in short
            </th>
          </tr>
        </thead>
        <tbody>
          {sample.map((s) => (
            <tr key={s.row} className="border-t border-line bg-surface">
              <td className="px-3 py-2 text-right">
                <Num>{s.row}</Num>
              </td>
              <td className="px-3 py-2">{actionWords[s.action]}</td>
              <td className="px-3 py-2">{s.summary}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/**
 * Imports a CSV file in two steps: "Check file" (nothing is written; every bad row is listed)
 * and "Import N rows", offered only for a checked file without errors. The kind and the file
 * stay chosen whatever happens, so fixing the file and checking again is one pick and one press.
 */
export function ImportForm({ shopId }: { shopId: string }) {
  const [kind, setKind] = useState<ImportKind>('parts');
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | null>(null);
  const [preview, setPreview] = useState<ImportResult | null>(null);
  const [done, setDone] = useState<ImportResult | null>(null);
  const [sending, setSending] = useState<ImportMode | null>(null);
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const send = useImportFile(shopId, setProgress);
  const fileInputRef = useRef<HTMLInputElement>(null);
  const resultRef = useRef<HTMLDivElement>(null);
  const kindName = useId();
  const columns = importColumns[kind];

  function reset() {
    setPreview(null);
    setDone(null);
    send.reset();
  }

  function run(mode: ImportMode) {
    if (!file) {
      setFileError('Choose a CSV file first.');
      fileInputRef.current?.focus();
      return;
    }
    setFileError(null);
    setProgress(null);
    setSending(mode);
    send.mutate(
      { file, kind, mode },
      {
        onSuccess: (result) => {
          if (mode === 'preview' || !result.committed) {
            setPreview(result);
            setDone(null);
          } else {
            setDone(result);
            setPreview(null);
          }
          requestAnimationFrame(() => resultRef.current?.focus());
        },
        onSettled: () => setSending(null),
      },
    );
  }

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    run('preview');
  }

  const canCommit = preview !== null && preview.errors.length === 0 && preview.rows > 0 && sending === null;

  return (
    <div className="flex flex-col gap-6">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5 rounded-lg border-2 border-line bg-surface p-5">
        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1 font-bold">What the file holds</legend>
          <div className="flex flex-wrap gap-2">
            {importKinds.map((k) => (
              <label key={k} className="flex min-h-touch cursor-pointer items-center gap-2 rounded-md border-2 border-line-strong bg-surface px-3 has-checked:border-accent has-checked:bg-accent-soft">
                <input
                  type="radio"
                  name={kindName}
                  value={k}
                  checked={kind === k}
                  onChange={() => {
                    setKind(k);
                    reset();
                  }}
                  className="size-5 accent-(--tp-accent)"
                />
                {importColumns[k].what}
              </label>
            ))}
          </div>
          <p className="text-sm text-ink-muted">
            Columns: <span className="font-mono">{columns.required.join(', ')}</span> (needed)
            {columns.optional.length > 0 && (
              <>
                , <span className="font-mono">{columns.optional.join(', ')}</span> (may be left out)
              </>
            )}
            . Header row first, columns in any order, comma or semicolon between fields. Part numbers are read as text, so leading zeros stay.
          </p>
        </fieldset>

        <FormField label="CSV file" error={fileError ?? undefined} hint="Save the spreadsheet as CSV (UTF-8) first.">
          {(control) => (
            <input
              {...control}
              ref={fileInputRef}
              type="file"
              accept=".csv,text/csv"
              className={inputClasses(Boolean(fileError), 'file:mr-3 file:rounded-md file:border-0 file:bg-sunk file:px-3 file:py-1 file:font-bold')}
              onChange={(e) => {
                setFile(e.target.files?.[0] ?? null);
                setFileError(null);
                reset();
              }}
            />
          )}
        </FormField>

        {send.isError && <FormMessage>{errorMessage(send.error)} Your choices are kept; try again when ready.</FormMessage>}

        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" variant={preview && preview.errors.length === 0 ? 'secondary' : 'primary'} loading={sending === 'preview'}>
            {preview ? 'Check file again' : 'Check file'}
          </Button>
          <Button variant="primary" disabled={!canCommit} loading={sending === 'commit'} onClick={() => run('commit')} aria-describedby={preview && !canCommit ? 'commit-why' : undefined}>
            {preview && preview.errors.length === 0 ? `Import ${countWords(preview.rows, 'row', 'rows')}` : 'Import'}
          </Button>
          {sending && file && (
            <span className="flex flex-wrap items-center gap-2 text-ink-muted">
              <Spinner size={18} className="text-accent" />
              {progress && progress.loaded < progress.total ? (
                <>
                  <span role="status">Sending {file.name}…</span>
                  <progress value={progress.loaded} max={progress.total} aria-label={`Upload of ${file.name}`} className="h-3 w-40 accent-(--tp-accent)" />
                  <span className="font-mono tabular">
                    {fileSizeWords(progress.loaded)} of {fileSizeWords(progress.total)}
                  </span>
                </>
              ) : (
                <span role="status">
                  {sending === 'preview' ? 'Checking' : 'Importing'} {file.name} ({fileSizeWords(file.size)})…
                </span>
              )}
            </span>
          )}
        </div>
        {preview && !canCommit && sending === null && (
          <p id="commit-why" className="text-sm text-ink-muted">
            {preview.errors.length > 0 ? 'Importing is possible once the file has no errors.' : 'The file has no rows to import.'}
          </p>
        )}
      </form>

      <div ref={resultRef} tabIndex={-1} className="flex flex-col gap-4 outline-none" aria-live="polite">
        {done && (
          <FormMessage tone="ok">
            <StatusPill status="ok" label="Imported" className="mr-2" />
            {countWords(done.rows, 'row', 'rows')} imported: {done.added} added, {done.changed} changed, {done.unchanged} unchanged.{' '}
            <Link to={paths.shop.catalogue.getHref(shopId)} className="text-accent underline underline-offset-4">
              Open the catalogue
            </Link>
          </FormMessage>
        )}
        {preview && (
          <section aria-labelledby="preview-title" className="flex flex-col gap-4 rounded-lg border-2 border-line bg-surface p-5">
            <h2 id="preview-title" className="text-lg font-bold">
              {preview.errors.length > 0 ? `Check of ${file?.name ?? 'the file'}: fix the errors` : `Check of ${file?.name ?? 'the file'}: ready to import`}
            </h2>
            <Counts result={preview} />
            {preview.errors.length > 0 && <ErrorsTable errors={preview.errors} />}
            <SampleTable sample={preview.sample} />
          </section>
        )}
      </div>
    </div>
  );
}
