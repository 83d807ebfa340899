import { itemResultWords, type Checklist, type ChecklistItemResult, type ItemRecord, type RecordItemInput } from '@tappet/contracts';
import { cautionTexts, compressionForDisplay, formatMeasurement, type PressureUnit } from '@tappet/domain';
import { Button, Caution, FormMessage, StatusPill, TextField, cn, inputClasses } from '@tappet/ui';
import { useId, useState } from 'react';
import { ApiError, errorMessage } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/dates';

type Item = Checklist['items'][number];

const results: ChecklistItemResult[] = ['ok', 'advise', 'fail', 'na'];

/** What is on record for an item, in one line. */
export function recordSummary(item: Item, record: ItemRecord, unit: PressureUnit): string {
  const parts: string[] = [];
  if (record.value !== null && item.unit) parts.push(`${record.value} ${item.unit}`);
  if (record.compressionKPa) {
    parts.push(record.compressionKPa.map((v, i) => `#${i + 1} ${formatMeasurement(compressionForDisplay(v, unit), unit)}`).join(', '));
    if (record.compressionSpreadPercent !== null) parts.push(`spread ${record.compressionSpreadPercent.toFixed(1)}\u00a0%`);
  }
  if (record.tyres) {
    parts.push(record.tyres.map((t) => `${t.position} ${t.code}: ${t.pre2000 ? 'made before 2000' : t.ageYears !== null ? `${t.ageYears.toFixed(1)} years` : '?'} (${t.verdict === 'unreadable' ? 'unreadable' : itemResultWords[t.verdict]})`).join('; '));
  }
  return parts.join(' · ');
}

/**
 * One checklist item: its result on record and, when `editable`, a form with big result buttons,
 * the readings its kind needs, a note and the cautions that belong to it. Compression is entered
 * in the shop's pressure unit and stored by the API in kPa.
 */
export function ChecklistItemCard({
  item,
  record,
  signedOff,
  editable,
  pressureUnit,
  saving,
  onSave,
  photos = [],
}: {
  item: Item;
  record: ItemRecord | undefined;
  signedOff: boolean;
  editable: boolean;
  pressureUnit: PressureUnit;
  saving: boolean;
  onSave: (input: RecordItemInput) => Promise<void>;
  /** The job's photos, to attach one to the item (none: no choice offered). */
  photos?: Array<{ id: string; label: string; thumbnailHref: string; href: string }>;
}) {
  const [open, setOpen] = useState(false);
  const [result, setResult] = useState<ChecklistItemResult | null>(record?.result ?? null);
  const [note, setNote] = useState(record?.note ?? '');
  const [value, setValue] = useState(record?.value !== null && record?.value !== undefined ? String(record.value) : '');
  const [readings, setReadings] = useState<string[]>(record?.compressionKPa ? record.compressionKPa.map((v) => String(Number(compressionForDisplay(v, pressureUnit).toFixed(1)))) : ['', '']);
  const [tyres, setTyres] = useState(record?.tyres ? record.tyres.map((t) => ({ position: t.position, code: t.code })) : [{ position: 'Front', code: '' }, { position: 'Rear', code: '' }]);
  const [photoId, setPhotoId] = useState(record?.photoFileId ?? '');
  const [error, setError] = useState<string | null>(null);
  const headingId = useId();
  const photo = record?.photoFileId ? photos.find((p) => p.id === record.photoFileId) : undefined;

  const save = async () => {
    if (!result) {
      setError('Choose a result: OK, Advise, Fail or Not applicable.');
      return;
    }
    const na = result === 'na';
    const input: RecordItemInput = { result, note: note.trim() || null, photoFileId: photoId || null };
    if (!na && item.kind === 'measure') input.value = value.trim() === '' ? null : Number(value);
    if (!na && item.kind === 'compression') input.compression = { unit: pressureUnit, readings: readings.filter((r) => r.trim() !== '').map(Number) };
    if (!na && item.kind === 'tyre_date') input.tyres = tyres.filter((t) => t.code.trim() !== '');
    setError(null);
    try {
      await onSave(input);
      setOpen(false);
    } catch (e) {
      const fields = e instanceof ApiError ? Object.values(e.fieldErrors) : [];
      setError(fields[0] ?? errorMessage(e));
    }
  };

  return (
    <li className={cn('rounded-md border-2 bg-surface p-4', item.safety ? 'border-line-strong' : 'border-line')} aria-labelledby={headingId}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0 flex-1">
          <h4 id={headingId} className="font-bold">
            {item.label}
            {item.safety && <span className="ml-2 rounded-sm border border-fail px-1 text-sm text-fail">Safety-critical</span>}
          </h4>
          {item.guidance && <p className="text-sm text-ink-muted">{item.guidance}</p>}
          {record && (
            <div className="mt-2 flex flex-wrap items-center gap-2">
              <StatusPill status={record.result} />
              {signedOff && <span className="text-sm font-bold">Unresolved: signed off by the owner</span>}
              <span className="text-sm">{recordSummary(item, record, pressureUnit)}</span>
              {record.note && <span className="text-sm text-ink-muted">“{record.note}”</span>}
              {record.recordedBy && <span className="text-sm text-ink-muted">— {record.recordedBy.name}, {formatDateTime(record.recordedAt)}</span>}
              {photo && (
                <a href={photo.href} target="_blank" rel="noreferrer" aria-label={`Photo of this item: ${photo.label}`}>
                  <img src={photo.thumbnailHref} alt={photo.label} className="h-12 rounded-sm border border-line object-cover" />
                </a>
              )}
            </div>
          )}
          {!record && <p className="mt-2 text-sm text-ink-muted">Not recorded yet.</p>}
        </div>
        {editable && !open && (
          <Button variant="secondary" onClick={() => setOpen(true)} aria-label={`${record ? 'Change' : 'Record'}: ${item.label}`}>
            {record ? 'Change' : 'Record'}
          </Button>
        )}
      </div>
      {open && (
        <form
          className="mt-4 flex flex-col gap-4"
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            void save();
          }}
        >
          {item.cautions.map((c) => (
            <Caution key={c} title={cautionTexts[c].title}>
              {cautionTexts[c].text}
            </Caution>
          ))}
          <fieldset>
            <legend className="mb-2 font-bold">Result</legend>
            <div className="grid grid-cols-2 gap-2 sm:grid-cols-4">
              {results.map((r) => (
                <label key={r} className={cn('flex min-h-touch cursor-pointer items-center justify-center gap-2 rounded-md border-2 px-3 py-2 font-bold', result === r ? 'border-accent bg-accent-soft' : 'border-line-strong')}>
                  <input type="radio" name={`${headingId}-result`} value={r} checked={result === r} onChange={() => setResult(r)} className="h-5 w-5" />
                  {itemResultWords[r]}
                </label>
              ))}
            </div>
          </fieldset>
          {item.kind === 'measure' && result !== 'na' && (
            <TextField
              label={`Measured value (${item.unit ?? ''})`}
              inputMode="decimal"
              value={value}
              onChange={(e) => setValue(e.target.value)}
              hint={item.min !== null || item.max !== null ? `Expected ${item.min ?? '…'} to ${item.max ?? '…'} ${item.unit ?? ''}` : undefined}
            />
          )}
          {item.kind === 'compression' && result !== 'na' && (
            <fieldset>
              <legend className="mb-2 font-bold">Compression per cylinder ({pressureUnit})</legend>
              {item.min !== null && <p className="mb-2 text-sm text-ink-muted">Expected at least {formatMeasurement(compressionForDisplay(item.min, pressureUnit), pressureUnit)}; cylinders within about 10&nbsp;% of each other (common practice).</p>}
              <div className="flex flex-wrap gap-2">
                {readings.map((r, i) => (
                  <TextField key={i} label={`Cylinder ${i + 1}`} inputMode="decimal" value={r} fieldClassName="w-32" onChange={(e) => setReadings(readings.map((x, j) => (j === i ? e.target.value : x)))} />
                ))}
              </div>
              <div className="mt-2 flex gap-2">
                <Button variant="secondary" size="sm" onClick={() => setReadings([...readings, ''])} disabled={readings.length >= 16}>
                  Add cylinder
                </Button>
                <Button variant="ghost" size="sm" onClick={() => setReadings(readings.slice(0, -1))} disabled={readings.length <= 1}>
                  Remove last cylinder
                </Button>
              </div>
            </fieldset>
          )}
          {item.kind === 'tyre_date' && result !== 'na' && (
            <fieldset>
              <legend className="mb-2 font-bold">DOT date code of each tyre</legend>
              <p className="mb-2 text-sm text-ink-muted">The last four digits are week and year (2319 = week 23 of 2019). Three digits mean made before 2000. Tappet advises from 6 years and fails from 10: common practice, not a regulation.</p>
              {tyres.map((t, i) => (
                <div key={i} className="mb-2 flex flex-wrap gap-2">
                  <TextField label={`Tyre ${i + 1} position`} value={t.position} fieldClassName="w-40" onChange={(e) => setTyres(tyres.map((x, j) => (j === i ? { ...x, position: e.target.value } : x)))} />
                  <TextField label={`Tyre ${i + 1} DOT code`} value={t.code} className="font-mono" fieldClassName="w-56" onChange={(e) => setTyres(tyres.map((x, j) => (j === i ? { ...x, code: e.target.value } : x)))} />
                </div>
              ))}
              <Button variant="secondary" size="sm" onClick={() => setTyres([...tyres, { position: '', code: '' }])} disabled={tyres.length >= 8}>
                Add tyre
              </Button>
            </fieldset>
          )}
          {photos.length > 0 && (
            <label className="flex flex-col gap-1">
              <span className="font-bold">Photo of this item</span>
              <select className={inputClasses(false)} value={photoId} onChange={(e) => setPhotoId(e.target.value)}>
                <option value="">None</option>
                {photos.map((p) => (
                  <option key={p.id} value={p.id}>
                    {p.label}
                  </option>
                ))}
              </select>
            </label>
          )}
          <label className="flex flex-col gap-1">
            <span className="font-bold">Note</span>
            <textarea rows={2} className={inputClasses(false)} value={note} onChange={(e) => setNote(e.target.value)} maxLength={1000} />
          </label>
          {error && <FormMessage>{error}</FormMessage>}
          <div className="flex gap-2">
            <Button type="submit" loading={saving}>
              Save
            </Button>
            <Button variant="secondary" onClick={() => setOpen(false)}>
              Cancel
            </Button>
          </div>
        </form>
      )}
    </li>
  );
}
