import { stockConditions, type CountDetail, type CountLine, type StockCondition } from '@tappet/contracts';
import { Button, CameraScanButton, cn, EmptyState, ErrorState, LoadingState, Num, PartNumber, Select, TextField, useToast } from '@tappet/ui';
import { useMemo, useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { useCount } from '../api/get-count';
import { attachBarcode, findBarcode, looksLikeGtin } from '../api/barcodes';
import { resolveCode } from '../api/resolve-code';
import { enterCount, useCountMutation } from '../api/write-counts';
import { CountLabelsButton } from './count-labels-button';
import { codeKey, conditionWords, countStatusWords } from './count-words';
import { scopeWords } from './counts-list';
import { formatTime } from '../../../lib/dates';

type Mode = 'set' | 'add';

/** The bins of a count, by code: its chosen bins and any bin one of its lines sits in. */
function binsOf(count: CountDetail): Array<{ id: string; code: string }> {
  const map = new Map<string, string>(count.scope.bins.map((b) => [b.id, b.code]));
  for (const l of count.lines) map.set(l.binId, l.binCode);
  return [...map].map(([id, code]) => ({ id, code })).sort((a, b) => a.code.localeCompare(b.code));
}

/** One line to count: part, condition, who counted it last, and the quantity field. */
function LineRow({ line, mode, canCount, highlighted, inputRef, onSave, saving }: { line: CountLine; mode: Mode; canCount: boolean; highlighted: boolean; inputRef: (el: HTMLInputElement | null) => void; onSave: (line: CountLine, quantity: number) => void; saving: boolean }) {
  const [error, setError] = useState<string | undefined>();
  const label = `Counted ${line.partNumber}, ${conditionWords[line.condition].toLowerCase()}`;
  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const raw = new FormData(event.currentTarget).get('quantity');
    const text = typeof raw === 'string' ? raw.trim() : '';
    const n = Number(text);
    if (text === '' || !Number.isInteger(n) || n < 0) {
      setError('Enter a whole number, 0 or more.');
      return;
    }
    setError(undefined);
    onSave(line, n);
  }
  return (
    <li className={cn('flex flex-wrap items-end justify-between gap-3 px-3 py-3', highlighted && 'bg-accent-soft')} aria-current={highlighted ? 'true' : undefined}>
      <div className="min-w-0 flex-1">
        <p>
          <PartNumber>{line.partNumber}</PartNumber> <span className="text-ink-muted">· {conditionWords[line.condition]}</span>
          {line.added && <span className="ml-2 text-sm font-bold">Found during the count</span>}
        </p>
        <p className="break-words">{line.partDescription}</p>
        <p className="text-sm text-ink-muted">
          {line.countedQuantity === null ? (
            'Not counted yet'
          ) : (
            <>
              Counted <Num>{line.countedQuantity}</Num>
              {line.counted?.name ? ` by ${line.counted.name}` : ''}
              {line.counted ? `, ${formatTime(line.counted.at)}` : ''}
            </>
          )}
        </p>
      </div>
      {canCount && (
        <form noValidate onSubmit={submit} className="flex items-end gap-2">
          <TextField
            ref={inputRef}
            key={`${line.id}-${line.countedQuantity ?? 'none'}-${mode}`}
            label={mode === 'add' ? 'Add' : 'Counted'}
            aria-label={mode === 'add' ? `Add to ${label.toLowerCase()}` : label}
            name="quantity"
            inputMode="numeric"
            autoComplete="off"
            defaultValue={mode === 'set' && line.countedQuantity !== null ? String(line.countedQuantity) : ''}
            error={error}
            fieldClassName="w-32"
            className="text-right font-mono"
          />
          <Button type="submit" variant="secondary" loading={saving} aria-label={`Save count of ${line.partNumber}, ${conditionWords[line.condition].toLowerCase()}`}>
            Save
          </Button>
        </form>
      )}
    </li>
  );
}

/** Stock found in the bin that was not on the list: the part (resolved from the code), condition and quantity. */
function FoundStockForm({ part, binCode, onAdd, onCancel, saving }: { part: { id: string; number: string; description: string }; binCode: string; onAdd: (condition: StockCondition, quantity: number) => void; onCancel: () => void; saving: boolean }) {
  const [error, setError] = useState<string | undefined>();
  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const n = Number(String(data.get('quantity') ?? '').trim());
    if (!Number.isInteger(n) || n < 1) {
      setError('Enter how many you found (1 or more).');
      return;
    }
    onAdd(String(data.get('condition')) as StockCondition, n);
  }
  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-3 rounded-md border-2 border-line p-3" aria-label="Stock found that was not on the list">
      <p>
        <PartNumber>{part.number}</PartNumber> ({part.description}) is not on the list for bin <PartNumber>{binCode}</PartNumber>. Add what you found?
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <Select label="Condition" name="condition" options={stockConditions.map((c) => ({ value: c, label: conditionWords[c] }))} defaultValue="new" />
        <TextField label="Found" name="quantity" inputMode="numeric" autoComplete="off" error={error} className="w-24 text-right font-mono" />
        <Button type="submit" loading={saving}>
          Add to the count
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** A supplier barcode no part has yet: attach it to a part by its number (owners and buyers). */
function AttachBarcodeForm({ code, onAttach, onCancel, busy, error }: { code: string; onAttach: (partNumber: string) => void; onCancel: () => void; busy: boolean; error: string | null }) {
  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const number = String(new FormData(event.currentTarget).get('partNumber') ?? '').trim();
    if (number) onAttach(number);
  }
  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-3 rounded-md border-2 border-line p-3" aria-label="Attach a barcode to a part">
      <p>
        No part has the barcode <PartNumber>{code}</PartNumber> yet. Which part is it? It will be found by this barcode from now on.
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <TextField label="Part number" name="partNumber" autoComplete="off" className="font-mono" error={error ?? undefined} />
        <Button type="submit" loading={busy}>
          Attach the barcode
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/**
 * The counting screen: one bin at a time. A scan (keyboard-wedge scanner: the code then Enter, or
 * the camera) or a typed part number picks the part's line in the bin and puts the cursor in its
 * quantity; a bin label's code switches to that bin; a part not on the list can be added as found.
 * Progress refreshes while the count is open, since several people count at once.
 */
export function CountScreen({ shopId, countId }: { shopId: string; countId: string }) {
  const count = useCount(shopId, countId);
  const canCount = useCan('count', 'StockCount', { shopId });
  const canAttach = useCan('update', 'Part', { shopId });
  const [unknownCode, setUnknownCode] = useState<string | null>(null);
  const [attachError, setAttachError] = useState<string | null>(null);
  const [attaching, setAttaching] = useState(false);
  const enter = useCountMutation(shopId, enterCount);
  const toast = useToast();
  const [binId, setBinId] = useState<string>('');
  const [mode, setMode] = useState<Mode>('set');
  const [scanMessage, setScanMessage] = useState<string | null>(null);
  const [highlight, setHighlight] = useState<string | null>(null);
  const [found, setFound] = useState<{ id: string; number: string; description: string } | null>(null);
  const [savingLine, setSavingLine] = useState<string | null>(null);
  const scanRef = useRef<HTMLInputElement>(null);
  const inputs = useRef(new Map<string, HTMLInputElement>());

  const bins = useMemo(() => (count.data ? binsOf(count.data) : []), [count.data]);

  if (count.isPending) return <LoadingState label="Loading the count…" />;
  if (count.isError) return <ErrorState message={errorMessage(count.error)} onRetry={() => void count.refetch()} />;
  const data = count.data;
  const open = data.status === 'open';
  const bin = bins.find((b) => b.id === binId) ?? bins[0];
  const lines = data.lines.filter((l) => l.binId === bin?.id);
  const countedInBin = lines.filter((l) => l.countedQuantity !== null).length;
  const percent = data.lineCount === 0 ? 0 : Math.round((data.countedCount / data.lineCount) * 100);

  const focusLine = (lineId: string) => {
    setHighlight(lineId);
    // After the render that may have switched bins.
    requestAnimationFrame(() => inputs.current.get(lineId)?.focus());
  };

  /** The part's line in this bin, or "found stock" for a part not on the list. */
  function goToPart(part: { id: string; number: string; description: string }) {
    const inBin = lines.filter((l) => l.partId === part.id);
    if (inBin.length > 0) {
      setScanMessage(null);
      focusLine(inBin[0]!.id);
    } else if (open && canCount) {
      setFound(part);
      setScanMessage(null);
    } else setScanMessage(`${part.number} is not on the list for bin ${bin?.code ?? ''}.`);
  }

  async function onScan(code: string) {
    const key = codeKey(code);
    setFound(null);
    setUnknownCode(null);
    if (!key) return;
    // Supplier barcodes (EAN/UPC): the part they are attached to, or an offer to attach.
    if (looksLikeGtin(code) && !lines.some((l) => codeKey(l.partNumber) === key)) {
      try {
        const hit = await findBarcode(shopId, code);
        if (hit === 'unknown') {
          setScanMessage(canAttach ? null : `No part has the barcode ${code} yet: an owner or buyer can attach it to its part.`);
          if (canAttach) setUnknownCode(code.replace(/[\s-]/g, ''));
        } else goToPart(hit.part);
      } catch (error) {
        setScanMessage(errorMessage(error));
      }
      return;
    }
    const inBin = lines.filter((l) => codeKey(l.partNumber) === key);
    if (inBin.length > 0) {
      setScanMessage(inBin.length > 1 ? `${inBin[0]!.partNumber} is in this bin in ${inBin.length} conditions: the first is chosen.` : null);
      focusLine(inBin[0]!.id);
      return;
    }
    const asBin = bins.find((b) => codeKey(b.code) === key);
    if (asBin) {
      setBinId(asBin.id);
      setHighlight(null);
      setScanMessage(`Now counting bin ${asBin.code}.`);
      return;
    }
    const elsewhere = data.lines.find((l) => codeKey(l.partNumber) === key);
    setScanMessage(null);
    try {
      const part = await resolveCode(shopId, code);
      if (!part) {
        setScanMessage(`No part or bin of this count is numbered ${code}.`);
        return;
      }
      if (!open || !canCount) {
        setScanMessage(`${part.number} is not on the list for bin ${bin?.code ?? ''}.`);
        return;
      }
      setFound(part);
      if (elsewhere) setScanMessage(`${part.number} is listed in bin ${elsewhere.binCode}, not in ${bin?.code ?? ''}.`);
    } catch (error) {
      setScanMessage(errorMessage(error));
    }
  }

  async function attach(partNumber: string) {
    if (!unknownCode) return;
    setAttaching(true);
    setAttachError(null);
    try {
      const part = await resolveCode(shopId, partNumber);
      if (!part) {
        setAttachError(`No part is numbered ${partNumber}.`);
        return;
      }
      await attachBarcode(shopId, part.id, unknownCode);
      toast.show(`Barcode ${unknownCode} attached to ${part.number}.`, 'ok');
      setUnknownCode(null);
      goToPart(part);
    } catch (error) {
      setAttachError(errorMessage(error));
    } finally {
      setAttaching(false);
    }
  }

  function onScanSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const input = scanRef.current;
    const code = input?.value.trim() ?? '';
    if (input) input.value = '';
    void onScan(code);
  }

  function save(line: CountLine, quantity: number) {
    setSavingLine(line.id);
    enter.mutate(
      { countId, entry: { lineId: line.id, quantity, mode } },
      {
        onSuccess: (saved) => {
          toast.show(`${saved.partNumber}: ${saved.countedQuantity} counted.`, 'ok');
          setHighlight(null);
          scanRef.current?.focus();
        },
        onError: (error) => toast.show(errorMessage(error), 'fail'),
        onSettled: () => setSavingLine(null),
      },
    );
  }

  function addFound(condition: StockCondition, quantity: number) {
    if (!found || !bin) return;
    setSavingLine('found');
    enter.mutate(
      { countId, entry: { partId: found.id, binId: bin.id, condition, quantity, mode: 'set' } },
      {
        onSuccess: (saved) => {
          toast.show(`${saved.partNumber}: ${saved.countedQuantity} found and counted.`, 'ok');
          setFound(null);
          setScanMessage(null);
          scanRef.current?.focus();
        },
        onError: (error) => setScanMessage(errorMessage(error)),
        onSettled: () => setSavingLine(null),
      },
    );
  }

  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="count-summary" className="flex flex-col gap-3">
        <h2 id="count-summary" className="sr-only">
          Summary
        </h2>
        <p>
          <span className="font-bold">{countStatusWords[data.status]}</span> · {scopeWords(data)}
          {data.note ? ` · ${data.note}` : ''}
        </p>
        <div>
          <p id="count-progress-label">
            <Num>{data.countedCount}</Num> of <Num>{data.lineCount}</Num> lines counted
            {data.differenceCount > 0 ? (
              <>
                {' '}
                · <Num>{data.differenceCount}</Num> with a difference
              </>
            ) : null}
          </p>
          <progress aria-labelledby="count-progress-label" max={100} value={percent} className="mt-1 h-3 w-full max-w-md accent-accent" />
        </div>
        <div className="flex flex-wrap gap-2">
          <Link to={paths.shop.countReport.getHref(shopId, countId)} className="inline-flex min-h-touch items-center rounded-md border-2 border-accent px-4 font-bold text-accent no-underline hover:bg-accent-soft">
            {open ? 'Review differences' : 'Differences'}
          </Link>
          <CountLabelsButton shopId={shopId} countId={countId} binCount={bins.length} />
        </div>
      </section>

      {bins.length === 0 ? (
        <EmptyState title="Nothing to count">The chosen bins or categories held no stock when the count started.</EmptyState>
      ) : (
        <section aria-labelledby="count-bin" className="flex flex-col gap-4">
          <h2 id="count-bin" className="text-lg font-bold">
            Bin <PartNumber>{bin?.code ?? ''}</PartNumber>{' '}
            <span className="text-base font-normal text-ink-muted">
              (<Num>{countedInBin}</Num> of <Num>{lines.length}</Num> counted)
            </span>
          </h2>
          <div className="flex flex-wrap items-end gap-4">
            {bins.length > 1 && (
              <Select
                label="Bin"
                options={bins.map((b) => ({ value: b.id, label: b.code }))}
                value={bin?.id ?? ''}
                onChange={(e) => {
                  setBinId(e.target.value);
                  setHighlight(null);
                  setFound(null);
                  setScanMessage(null);
                }}
              />
            )}
            {open && canCount && (
              <fieldset className="flex flex-wrap gap-3">
                <legend className="mb-1 font-bold">Each entry</legend>
                <label className="flex min-h-touch items-center gap-2">
                  <input type="radio" name="mode" className="h-5 w-5 accent-accent" checked={mode === 'set'} onChange={() => setMode('set')} />
                  replaces the line’s count
                </label>
                <label className="flex min-h-touch items-center gap-2">
                  <input type="radio" name="mode" className="h-5 w-5 accent-accent" checked={mode === 'add'} onChange={() => setMode('add')} />
                  adds to it
                </label>
              </fieldset>
            )}
          </div>

          {open && (
            <form noValidate onSubmit={onScanSubmit} className="flex flex-wrap items-end gap-2" role="search" aria-label="Find a part in this bin">
              <TextField ref={scanRef} label="Scan or type a part number" name="code" autoComplete="off" hint="A scanner types the code and Enter; a bin label switches bins." className="font-mono" fieldClassName="min-w-64 flex-1" />
              <Button type="submit" variant="secondary">
                Find
              </Button>
              <CameraScanButton label="Scan with the camera" dialogTitle="Scan a part or bin label" typeLabel="Or type the number" onDetected={(code) => void onScan(code)} />
            </form>
          )}
          {scanMessage && (
            <p role="status" className="font-bold">
              {scanMessage}
            </p>
          )}
          {unknownCode && <AttachBarcodeForm code={unknownCode} onAttach={(n) => void attach(n)} onCancel={() => setUnknownCode(null)} busy={attaching} error={attachError} />}
          {found && bin && <FoundStockForm part={found} binCode={bin.code} onAdd={addFound} onCancel={() => setFound(null)} saving={savingLine === 'found'} />}
          {!open && <p className="rounded-md border border-line bg-sunk p-3">This count was {countStatusWords[data.status].toLowerCase()}: its figures can no longer change.</p>}

          {lines.length === 0 ? (
            <EmptyState title="Nothing listed in this bin">{open && canCount ? 'Scan what you find here to add it to the count.' : 'Nothing was in this bin when the count started.'}</EmptyState>
          ) : (
            <ul aria-label={`Lines in bin ${bin?.code ?? ''}`} className="flex flex-col divide-y divide-line rounded-md border border-line">
              {lines.map((line) => (
                <LineRow
                  key={line.id}
                  line={line}
                  mode={mode}
                  canCount={open && canCount}
                  highlighted={highlight === line.id}
                  saving={savingLine === line.id}
                  onSave={save}
                  inputRef={(el) => {
                    if (el) inputs.current.set(line.id, el);
                    else inputs.current.delete(line.id);
                  }}
                />
              ))}
            </ul>
          )}
        </section>
      )}
    </div>
  );
}
