import {
  holdInputSchema,
  stockAdjustmentInputSchema,
  stockCountInputSchema,
  stockIssueInputSchema,
  stockMoveInputSchema,
  stockReceiptInputSchema,
  stockReturnInputSchema,
  type StockCondition,
} from '@tappet/contracts';
import { minorUnitExponent, MoneyFormatError, parseMinorUnits } from '@tappet/domain';
import { Dialog, FormDialogFooter, FormMessage, PartNumber, Select, TextField, useToast, type SelectOption } from '@tappet/ui';
import { useId, useLayoutEffect, useRef, type FormEvent, type ReactNode } from 'react';
import type { z } from 'zod';
import { ApiError } from '../../../lib/api-client';
import { formValues, useFormErrors, zodFieldErrors, type FieldErrors } from '../../../lib/forms';
import { useBins } from '../api/get-bins';
import { resolvePartNumber } from '../api/resolve-part';
import { adjustStock, countStock, holdStock, issueStock, moveStock, receiveStock, returnStock, useStockMutation } from '../api/write-stock';
import { conditionOptions } from './words';

export type StockAction = 'receive' | 'issue' | 'return' | 'adjust' | 'move' | 'count' | 'hold';

/** What the dialog starts from: a part (and line) picked elsewhere, or nothing (type the number). */
export interface StockActionPreset {
  partId?: string;
  partNumber?: string;
  binId?: string;
  condition?: StockCondition;
  holdId?: string;
  quantity?: number;
  /** For issues from a hold: what the hold is for, shown to the person. */
  holdPurpose?: string;
}

const copy: Record<StockAction, { title: string; description: string; submit: string }> = {
  receive: { title: 'Receive stock', description: 'Goods in: they go into the bin at the unit cost you give, and the average cost is worked out again.', submit: 'Receive' },
  issue: { title: 'Issue stock', description: 'Takes free stock out of the bin, or the stock a hold set aside.', submit: 'Issue' },
  return: { title: 'Return to stock', description: 'Parts coming back from a job go back into a bin.', submit: 'Return' },
  adjust: { title: 'Adjust stock', description: 'Corrects a quantity. Say why: the reason is kept in the ledger.', submit: 'Adjust' },
  move: { title: 'Move to another bin', description: 'Moves free stock; held stock stays where its hold is.', submit: 'Move' },
  count: { title: 'Record a count', description: 'Enter what is on the shelf; any difference is booked as the variance.', submit: 'Save count' },
  hold: { title: 'Hold stock', description: 'Sets free stock aside so nobody else issues it.', submit: 'Hold' },
};

const schemas = {
  receive: stockReceiptInputSchema,
  issue: stockIssueInputSchema,
  return: stockReturnInputSchema,
  adjust: stockAdjustmentInputSchema,
  move: stockMoveInputSchema,
  count: stockCountInputSchema,
  hold: holdInputSchema,
} as const;

const writers = { receive: receiveStock, issue: issueStock, return: returnStock, adjust: adjustStock, move: moveStock, count: countStock, hold: holdStock } as const;

const fieldNames = ['partNumber', 'partId', 'binId', 'fromBinId', 'toBinId', 'condition', 'quantity', 'quantityDelta', 'countedQuantity', 'unitCostMinor', 'serials', 'serial', 'reason', 'purpose', 'reference'] as const;

/** A whole number typed in a text field; anything else is handed on for the schema to refuse in its words. */
function wholeNumber(value: string | undefined): number | string | undefined {
  const t = value?.trim() ?? '';
  if (!t) return undefined;
  const n = Number(t.replace('−', '-'));
  return Number.isFinite(n) ? n : t;
}

export interface StockActionDialogProps {
  shopId: string;
  action: StockAction | null;
  onClose: () => void;
  currency: string;
  preset?: StockActionPreset;
}

/**
 * One dialog for every movement a person records by hand: receive, issue, return, adjust (asks
 * why), move, count and hold. Fields are named as the API names them, so its field errors land
 * next to the right input; refusals (not enough free stock…) show as the form's message.
 */
export function StockActionDialog({ shopId, action, onClose, currency, preset = {} }: StockActionDialogProps) {
  const formRef = useRef<HTMLFormElement>(null);
  const formId = useId();
  const errors = useFormErrors(formRef);
  const toast = useToast();
  const bins = useBins(shopId);
  const mutation = useStockMutation(shopId, (s: string, input: { action: StockAction; body: unknown }) => (writers[input.action] as (s: string, b: unknown) => Promise<unknown>)(s, input.body));
  if (!action) return null;
  const text = copy[action];
  const exponent = minorUnitExponent(currency);
  const binOptions = (bins.data?.bins ?? []).filter((b) => b.active || b.id === preset.binId).map((b) => ({ value: b.id, label: b.description ? `${b.code} — ${b.description}` : b.code }));

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (!action) return;
    const v = formValues(event.currentTarget);
    const local: FieldErrors = {};
    let partId = preset.partId;
    if (!partId) {
      const number = v.partNumber?.trim() ?? '';
      if (!number) local.partNumber = 'Enter the part number.';
      else {
        try {
          partId = (await resolvePartNumber(shopId, number)).part?.id;
          if (!partId) local.partNumber = `${number} is known only as a link, not as a part: add it to the catalogue first.`;
        } catch (error) {
          if (error instanceof ApiError && error.status === 404) local.partNumber = `No part numbered ${number} in the catalogue.`;
          else return errors.failApi(error, fieldNames);
        }
      }
    }
    // An empty choice would otherwise be refused as an invalid id: say what to do instead.
    for (const [name, message] of action === 'move' ? ([['fromBinId', 'Choose the bin it comes from.'], ['toBinId', 'Choose the bin it goes to.']] as const) : ([['binId', 'Choose a bin.']] as const)) {
      if (!v[name]) local[name] = message;
    }
    let unitCostMinor: number | string | undefined;
    if (v.unitCostMinor?.trim()) {
      try {
        unitCostMinor = parseMinorUnits(v.unitCostMinor, exponent);
      } catch (error) {
        if (!(error instanceof MoneyFormatError)) throw error;
        local.unitCostMinor = `Enter the cost like 12.50 (at most ${exponent} decimals).`;
      }
    }
    const serials = (v.serials ?? '')
      .split(/[\n,]/)
      .map((s) => s.trim())
      .filter(Boolean);
    const optional = (s: string | undefined) => (s?.trim() ? s.trim() : undefined);
    const common = { partId, condition: v.condition, reference: optional(v.reference) ?? null };
    const bodies: Record<StockAction, Record<string, unknown>> = {
      receive: { ...common, binId: v.binId, quantity: wholeNumber(v.quantity), unitCostMinor, ...(serials.length ? { serials } : {}) },
      issue: { ...common, binId: v.binId, quantity: wholeNumber(v.quantity), serial: optional(v.serial), holdId: preset.holdId },
      return: { ...common, binId: v.binId, quantity: wholeNumber(v.quantity), unitCostMinor, serial: optional(v.serial) },
      adjust: { ...common, binId: v.binId, quantityDelta: wholeNumber(v.quantityDelta), unitCostMinor, reason: v.reason ?? '' },
      move: { partId, condition: v.condition, fromBinId: v.fromBinId, toBinId: v.toBinId, quantity: wholeNumber(v.quantity), serial: optional(v.serial), reference: common.reference },
      count: { partId, binId: v.binId, condition: v.condition, countedQuantity: wholeNumber(v.countedQuantity), unitCostMinor },
      hold: { partId, binId: v.binId, condition: v.condition, quantity: wholeNumber(v.quantity), purpose: v.purpose ?? '' },
    };
    if (action === 'receive' && unitCostMinor === undefined && !local.unitCostMinor) local.unitCostMinor = 'Enter the unit cost.';
    const parsed = (schemas[action] as z.ZodType).safeParse(bodies[action]);
    const found = parsed.success ? {} : zodFieldErrors(parsed.error);
    if (found.serials === undefined) for (const key of Object.keys(found)) if (key.startsWith('serials.')) found.serials = found[key]!;
    const all = { ...found, ...local };
    if (!preset.partId && all.partId) delete all.partId;
    if (Object.keys(all).length > 0 || !parsed.success) {
      return errors.failApi(new ApiError(400, 'validation_failed', 'Check the fields marked below.', all), fieldNames);
    }
    errors.clear();
    mutation.mutate(
      { action, body: parsed.data },
      {
        onSuccess: () => {
          toast.show(`${text.submit === 'Save count' ? 'Count saved' : `${text.submit} recorded`} for ${preset.partNumber ?? v.partNumber ?? 'the part'}.`, 'ok');
          onClose();
        },
        onError: (error) => errors.failApi(error, fieldNames),
      },
    );
  }

  const f = errors.fieldErrors;
  const field = (node: ReactNode) => node;
  const binSelect = (name: string, label: string, defaultValue?: string) => (
    <BinSelect label={label} name={name} options={binOptions} loading={bins.isPending} arrived={bins.isSuccess} preset={defaultValue ?? ''} error={f[name]} />
  );
  const cost = (hint: string) => <TextField label={`Unit cost (${currency})`} name="unitCostMinor" inputMode="decimal" hint={hint} error={f.unitCostMinor} className="font-mono" autoComplete="off" />;

  return (
    <Dialog
      open
      onClose={onClose}
      title={text.title}
      description={text.description}
      className="max-w-2xl"
      footer={<FormDialogFooter formId={formId} submitLabel={text.submit} loading={mutation.isPending} onCancel={onClose} />}
    >
      <form id={formId} ref={formRef} noValidate onSubmit={(e) => void onSubmit(e)} className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        {errors.formError && (
          <div className="sm:col-span-2">
            <FormMessage>{errors.formError}</FormMessage>
          </div>
        )}
        {preset.partId ? (
          <p className="sm:col-span-2">
            Part <PartNumber className="font-bold">{preset.partNumber ?? ''}</PartNumber>
            {preset.holdPurpose && <span className="text-ink-muted"> · held for {preset.holdPurpose}</span>}
          </p>
        ) : (
          <TextField label="Part number" name="partNumber" error={f.partNumber} hint="As printed; a supplier's number works too." className="font-mono" autoComplete="off" fieldClassName="sm:col-span-2" />
        )}
        {action === 'move' ? (
          <>
            {binSelect('fromBinId', 'From bin', preset.binId)}
            {binSelect('toBinId', 'To bin')}
          </>
        ) : (
          binSelect('binId', 'Bin', preset.binId)
        )}
        <Select label="Condition" name="condition" options={conditionOptions} defaultValue={preset.condition ?? 'new'} error={f.condition} />
        {(action === 'receive' || action === 'issue' || action === 'return' || action === 'move' || action === 'hold') &&
          field(<TextField label="Quantity" name="quantity" inputMode="numeric" defaultValue={preset.quantity ?? ''} error={f.quantity} className="font-mono" autoComplete="off" />)}
        {action === 'adjust' && <TextField label="Change" name="quantityDelta" inputMode="numeric" hint="−2 takes two off; 1 adds one." error={f.quantityDelta} className="font-mono" autoComplete="off" />}
        {action === 'count' && <TextField label="Counted on the shelf" name="countedQuantity" inputMode="numeric" error={f.countedQuantity} className="font-mono" autoComplete="off" />}
        {action === 'receive' && cost('Per unit, e.g. 12.50.')}
        {action === 'return' && cost('Optional: the cost it was issued at. Empty: the current average.')}
        {action === 'adjust' && cost('Only for stock found, when nothing is on hand to average from.')}
        {action === 'count' && cost('Only needed when nothing was on hand to average from.')}
        {action === 'receive' && (
          <TextField label="Serial numbers" name="serials" hint="Engines, gearboxes, frames: one number per unit, separated by commas. Leave empty for counted parts." error={f.serials} className="font-mono" autoComplete="off" fieldClassName="sm:col-span-2" />
        )}
        {(action === 'issue' || action === 'return' || action === 'move') && <TextField label="Serial number" name="serial" hint="Only for items tracked one by one." error={f.serial} className="font-mono" autoComplete="off" />}
        {action === 'adjust' && <TextField label="Reason" name="reason" hint="Why the stock changes, e.g. damaged in storage." error={f.reason} autoComplete="off" fieldClassName="sm:col-span-2" />}
        {action === 'hold' && <TextField label="Held for" name="purpose" hint="The job or customer, e.g. Recommissioning, blue twin." error={f.purpose} autoComplete="off" fieldClassName="sm:col-span-2" />}
        {(action === 'receive' || action === 'issue' || action === 'return' || action === 'adjust') && (
          <TextField label="Reference" name="reference" hint="Optional: delivery note, job or sale." error={f.reference} autoComplete="off" />
        )}
      </form>
    </Dialog>
  );
}

/**
 * A bin choice whose options may arrive after the dialog opens. The bin it was opened for is
 * chosen when they do, on the same select: re-mounting it would take a keyboard user's focus away.
 */
function BinSelect({ label, name, options, loading, arrived, preset, error }: { label: string; name: string; options: SelectOption[]; loading: boolean; arrived: boolean; preset: string; error?: string }) {
  const ref = useRef<HTMLSelectElement>(null);
  useLayoutEffect(() => {
    // A select cannot take a value before its option exists; the person may have chosen since.
    if (arrived && ref.current && ref.current.value === '' && preset) ref.current.value = preset;
  }, [arrived, preset]);
  return <Select ref={ref} label={label} name={name} options={options} placeholder={loading ? 'Loading bins…' : 'Choose a bin'} defaultValue={preset} error={error} />;
}
