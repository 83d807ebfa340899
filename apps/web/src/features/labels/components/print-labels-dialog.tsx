import {
  labelPageCount,
  labelSheetLayouts,
  labelsPerPage,
  maxLabelBinsPerRequest,
  maxLabelCopies,
  maxLabelPartsPerRequest,
  maxLabelsPerRequest,
  type LabelFormat,
} from '@tappet/contracts';
import { Button, Dialog, ErrorState, LoadingState, PartNumber, Select, TextField, buttonClasses } from '@tappet/ui';
import { useEffect, useId, useMemo, useState, type FormEvent } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { useLabelOptions } from '../api/get-label-options';
import { usePrintLabels, type LabelFile } from '../api/print-labels';

/**
 * What the labels are for: chosen parts, chosen bins, or what purchase receipts brought in (each
 * label then names the bin it went to). Each item carries what a person reads.
 */
export type LabelSource =
  | { kind: 'parts'; parts: { id: string; number: string }[] }
  | { kind: 'bins'; bins: { id: string; code: string }[] }
  | { kind: 'receipts'; receiptIds: string[]; parts: { id: string; number: string; quantity: number }[] };

export interface PrintLabelsDialogProps {
  shopId: string;
  source: LabelSource;
  open: boolean;
  onClose: () => void;
}

/** "26 labels on 2 A4 sheets", "3 labels for the roll printer". */
const countWords = (format: LabelFormat, labels: number, pages: number) => {
  const what = `${labels} ${labels === 1 ? 'label' : 'labels'}`;
  if (format === 'roll-62x29') return `${what} for the roll printer, one a page`;
  const sheet = format === 'a4-3x8' ? 'A4 sheet' : 'Letter sheet';
  return `${what} on ${pages} ${sheet}${pages === 1 ? '' : 's'}`;
};

/** Shows a few of the chosen items by number, then how many more. */
function ChosenList({ source }: { source: LabelSource }) {
  const names = source.kind === 'bins' ? source.bins.map((b) => b.code) : source.parts.map((p) => p.number);
  const shown = names.slice(0, 6);
  return (
    <p className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
      <span className="font-bold">{source.kind !== 'bins' ? (names.length === 1 ? 'Part:' : `${names.length} parts:`) : names.length === 1 ? 'Bin:' : `${names.length} bins:`}</span>
      {shown.map((n) => (
        <PartNumber key={n}>{n}</PartNumber>
      ))}
      {names.length > shown.length && <span className="text-ink-muted">and {names.length - shown.length} more</span>}
    </p>
  );
}

/**
 * Prints labels as a PDF: the format (the shop's own preselected), copies of each part label,
 * the first free position on a partly used sheet, and for bins whether to add their parts. The
 * file is offered to open or download once it is made.
 */
export function PrintLabelsDialog({ shopId, source, open, onClose }: PrintLabelsDialogProps) {
  const formId = useId();
  const options = useLabelOptions(shopId);
  const print = usePrintLabels(shopId);
  const [format, setFormat] = useState<LabelFormat | null>(null);
  const [copies, setCopies] = useState('1');
  const [start, setStart] = useState('1');
  const [contents, setContents] = useState(true);
  const [perUnit, setPerUnit] = useState(true);
  const [errors, setErrors] = useState<{ copies?: string; start?: string }>({});
  const [file, setFile] = useState<(LabelFile & { url: string }) | null>(null);

  const chosenFormat: LabelFormat | null = format ?? options.data?.defaultFormat ?? null;
  const count = source.kind === 'bins' ? source.bins.length : source.parts.length;
  const perPage = chosenFormat ? labelsPerPage(chosenFormat) : 1;
  const receiptLabels = source.kind === 'receipts' ? (perUnit ? source.parts.reduce((n, p) => n + p.quantity, 0) : source.receiptIds.length) : 0;
  const tooMany =
    source.kind === 'parts' ? count > maxLabelPartsPerRequest : source.kind === 'bins' ? count > maxLabelBinsPerRequest : receiptLabels > maxLabelsPerRequest;
  const copiesNumber = Number(copies);
  const startNumber = Number(start);

  // The object URL lives as long as the dialog shows it.
  useEffect(() => () => {
    if (file) URL.revokeObjectURL(file.url);
  }, [file]);

  const summary = useMemo(() => {
    if (!chosenFormat || source.kind === 'bins') return null;
    if (source.kind === 'parts' && (!Number.isInteger(copiesNumber) || copiesNumber < 1)) return null;
    const labels = source.kind === 'parts' ? count * copiesNumber : receiptLabels;
    const skip = perPage > 1 && Number.isInteger(startNumber) && startNumber >= 1 && startNumber <= perPage ? startNumber - 1 : 0;
    return countWords(chosenFormat, labels, labelPageCount(chosenFormat, labels, skip));
  }, [chosenFormat, source.kind, count, copiesNumber, perPage, startNumber, receiptLabels]);

  const submit = (event: FormEvent) => {
    event.preventDefault();
    if (!chosenFormat || tooMany) return;
    const found: typeof errors = {};
    if (source.kind === 'parts') {
      if (!Number.isInteger(copiesNumber) || copiesNumber < 1 || copiesNumber > maxLabelCopies) found.copies = `Use a whole number from 1 to ${maxLabelCopies}.`;
      else if (count * copiesNumber > maxLabelsPerRequest) found.copies = `That makes ${count * copiesNumber} labels; print at most ${maxLabelsPerRequest} at a time.`;
    }
    if (perPage > 1 && (!Number.isInteger(startNumber) || startNumber < 1 || startNumber > perPage)) found.start = `Use a position from 1 to ${perPage} (left to right, top to bottom).`;
    setErrors(found);
    if (Object.keys(found).length > 0) return;
    const skip = perPage > 1 ? startNumber - 1 : 0;
    const request =
      source.kind === 'parts'
        ? { kind: 'parts' as const, partIds: source.parts.map((p) => p.id), copies: copiesNumber, format: chosenFormat, skip }
        : source.kind === 'bins'
          ? { kind: 'bins' as const, binIds: source.bins.map((b) => b.id), contents, format: chosenFormat, skip }
          : { kind: 'receipts' as const, receiptIds: source.receiptIds, perUnit, format: chosenFormat, skip };
    print.mutate(request, { onSuccess: (made) => setFile({ ...made, url: URL.createObjectURL(made.blob) }) });
  };

  const footer = file ? (
    <>
      <Button variant="secondary" onClick={onClose}>
        Done
      </Button>
      <a href={file.url} download={file.fileName} className={buttonClasses('secondary')}>
        Download
      </a>
      <a href={file.url} target="_blank" rel="noopener" className={buttonClasses('primary')}>
        Open the PDF
      </a>
    </>
  ) : (
    <>
      <Button variant="secondary" onClick={onClose}>
        Cancel
      </Button>
      <Button type="submit" form={formId} loading={print.isPending} disabled={!chosenFormat || tooMany}>
        Make the PDF
      </Button>
    </>
  );

  return (
    <Dialog open={open} onClose={onClose} title={source.kind === 'bins' ? 'Print bin labels' : source.kind === 'receipts' ? 'Print labels for what arrived' : 'Print part labels'} description={<ChosenList source={source} />} footer={footer}>
      {options.isPending ? (
        <LoadingState label="Loading the label formats…" />
      ) : options.isError ? (
        <ErrorState message={errorMessage(options.error)} onRetry={() => void options.refetch()} />
      ) : file ? (
        <div role="status" className="flex flex-col gap-2">
          <p className="font-bold">The labels are ready.</p>
          <p>
            {chosenFormat ? countWords(chosenFormat, file.labels, file.pages) : `${file.labels} labels`}. Print at actual size (100&nbsp;%, no “fit to page”) so the labels
            meet the sheet.
          </p>
        </div>
      ) : (
        <form id={formId} onSubmit={submit} noValidate className="flex flex-col gap-4">
          <Select
            label="Label format"
            hint={options.data.defaultFormat === chosenFormat ? 'The shop’s usual format (the owner sets it in the shop settings).' : 'Only for this print; the shop’s usual format stays as it is.'}
            value={chosenFormat ?? ''}
            onChange={(event) => setFormat(event.target.value as LabelFormat)}
            options={options.data.formats.map((f) => ({ value: f.id, label: f.id === options.data.defaultFormat ? `${f.name} — shop default` : f.name }))}
          />
          {source.kind === 'parts' && (
            <TextField label="Copies of each label" type="number" inputMode="numeric" min={1} max={maxLabelCopies} value={copies} error={errors.copies} onChange={(event) => setCopies(event.target.value)} />
          )}
          {perPage > 1 && chosenFormat && (
            <TextField
              label="Start at label position"
              hint={`To use up a partly used sheet: ${labelSheetLayouts[chosenFormat].columns} across, counted left to right and top to bottom (1 to ${perPage}).`}
              type="number"
              inputMode="numeric"
              min={1}
              max={perPage}
              value={start}
              error={errors.start}
              onChange={(event) => setStart(event.target.value)}
            />
          )}
          {source.kind === 'receipts' && (
            <label className="flex min-h-touch items-center gap-3">
              <input type="checkbox" checked={perUnit} onChange={(event) => setPerUnit(event.target.checked)} className="h-5 w-5 accent-accent" />
              One label for each unit received (otherwise one for each line received)
            </label>
          )}
          {source.kind === 'bins' && (
            <label className="flex min-h-touch items-center gap-3">
              <input type="checkbox" checked={contents} onChange={(event) => setContents(event.target.checked)} className="h-5 w-5 accent-accent" />
              Also a label for each part in the bin
            </label>
          )}
          {summary && !tooMany && <p className="text-ink-muted">{summary}</p>}
          {tooMany && (
            <p role="alert" className="font-bold">
              {source.kind === 'parts'
                ? `${count} parts are chosen; print labels for at most ${maxLabelPartsPerRequest} at a time. Clear some of the choice and print the rest afterwards.`
                : source.kind === 'bins'
                  ? `${count} bins are chosen; print labels for at most ${maxLabelBinsPerRequest} at a time.`
                  : `That makes ${receiptLabels} labels; print at most ${maxLabelsPerRequest} at a time (one for each line received instead).`}
            </p>
          )}
          {print.isError && (
            <p role="alert" className="font-bold text-fail">
              {errorMessage(print.error)}
            </p>
          )}
        </form>
      )}
    </Dialog>
  );
}
