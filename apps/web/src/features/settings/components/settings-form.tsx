import { distanceUnits, labelSheetFormats, pressureUnits, shopSettingsSchema, type ShopSettings, type UpdateShopSettingsRequest } from '@tappet/contracts';
import { Button, FormField, FormMessage, inputClasses, Select, TextField, useToast } from '@tappet/ui';
import { useRef, type FormEvent, type ReactNode } from 'react';
import { z } from 'zod';
import { formValues, useFormErrors, zodFieldErrors, type FieldErrors } from '../../../lib/forms';
import { useUpdateSettings } from '../api/update-settings';

const distanceLabels: Record<(typeof distanceUnits)[number], string> = { mi: 'Miles', km: 'Kilometres' };
const pressureLabels: Record<(typeof pressureUnits)[number], string> = { psi: 'psi', kPa: 'kPa', bar: 'bar' };
const labelSheetLabels: Record<(typeof labelSheetFormats)[number], string> = {
  'a4-3x8': 'A4 sheet, 3 × 8 labels (70 × 37 mm)',
  'letter-3x10': 'US Letter sheet, 3 × 10 labels (66.7 × 25.4 mm)',
  'roll-62x29': 'Label roll, 62 × 29 mm',
};

const fieldNames = Object.keys(shopSettingsSchema.shape) as Array<keyof ShopSettings>;

/** Minor units as the major-unit text a person types ("6000" → "60.00"). */
export function minorToMajorText(minor: number): string {
  return (minor / 100).toFixed(2);
}

/** Major-unit text ("62.5", "1,250") as minor units; null when it is not a plain amount. */
export function majorTextToMinor(text: string): number | null {
  const cleaned = text.replace(/[\s,]/g, '');
  if (!/^\d+(\.\d{1,2})?$/.test(cleaned)) return null;
  const [whole = '0', fraction = ''] = cleaned.split('.');
  return Number(whole) * 100 + Number(fraction.padEnd(2, '0'));
}

/**
 * Reads the form into settings, checked by the contract's own schema. Amounts are typed in major
 * units and numbers as text, so each gets a plain message when it is not a number at all.
 */
export function readSettingsForm(values: Record<string, string>): { ok: true; settings: ShopSettings } | { ok: false; errors: FieldErrors } {
  const errors: FieldErrors = {};
  const number = (key: string) => {
    const text = (values[key] ?? '').trim().replace(',', '.');
    if (text === '' || Number.isNaN(Number(text))) {
      errors[key] = 'Enter a number.';
      return 0;
    }
    return Number(text);
  };
  const money = (key: string) => {
    const minor = majorTextToMinor(values[key] ?? '');
    if (minor === null) {
      errors[key] = 'Enter an amount such as 60 or 62.50.';
      return 0;
    }
    return minor;
  };
  const candidate = {
    name: values.name ?? '',
    address: values.address ?? '',
    currency: values.currency ?? '',
    distanceUnit: values.distanceUnit,
    pressureUnit: values.pressureUnit,
    taxRatePercent: number('taxRatePercent'),
    labourRateMinorPerHour: money('labourRateMinorPerHour'),
    serviceLevel: number('serviceLevel'),
    orderingCostMinor: money('orderingCostMinor'),
    holdingCostRatePercent: number('holdingCostRatePercent'),
    labelSheetFormat: values.labelSheetFormat,
  };
  const parsed = shopSettingsSchema.safeParse(candidate);
  if (!parsed.success) Object.assign(errors, { ...zodFieldErrors(parsed.error), ...errors });
  if (Object.keys(errors).length > 0 || !parsed.success) return { ok: false, errors };
  return { ok: true, settings: parsed.data };
}

/** Only the settings that differ from what is saved. */
export function changedSettings(before: ShopSettings, after: ShopSettings): UpdateShopSettingsRequest {
  const patch: Record<string, unknown> = {};
  for (const key of fieldNames) if (before[key] !== after[key]) patch[key] = after[key];
  return patch as UpdateShopSettingsRequest;
}

function Group({ title, description, children }: { title: string; description: string; children: ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-4 rounded-lg border-2 border-line bg-surface p-5">
      <legend className="px-1 text-lg font-bold">{title}</legend>
      <p className="-mt-2 text-ink-muted">{description}</p>
      <div className="grid grid-cols-1 gap-4 md:grid-cols-2">{children}</div>
    </fieldset>
  );
}

/** Every shop setting in one form, grouped; saves only what changed. */
export function SettingsForm({ shopId, settings }: { shopId: string; settings: ShopSettings }) {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const update = useUpdateSettings(shopId);
  const toast = useToast();
  const e = errors.fieldErrors;
  const currency = settings.currency;

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const read = readSettingsForm(formValues(event.currentTarget));
    if (!read.ok) {
      // Through the zod path, so focus moves to the first field to fix and its message is read out.
      errors.failValidation(new z.ZodError(Object.entries(read.errors).map(([key, message]) => ({ code: 'custom' as const, path: [key], message, input: undefined }))));
      return;
    }
    errors.clear();
    const patch = changedSettings(settings, read.settings);
    if (Object.keys(patch).length === 0) {
      toast.show('Nothing changed.', 'info');
      return;
    }
    update.mutate(patch, {
      onSuccess: (saved) => {
        const renamed = patch.name !== undefined ? `Shop renamed to ${saved.name}.` : null;
        const others = Object.keys(patch).some((k) => k !== 'name');
        toast.show(renamed && others ? `Settings saved. ${renamed}` : (renamed ?? 'Settings saved.'), 'ok');
      },
      onError: (error) => errors.failApi(error, fieldNames),
    });
  }

  return (
    // A new key after each save resets the fields to the saved values.
    <form key={JSON.stringify(settings)} ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-6" aria-label="Shop settings">
      {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
      <Group title="Shop" description="Shown to everyone in the shop, in the shop switcher and on documents.">
        <TextField label="Shop name" name="name" defaultValue={settings.name} autoComplete="organization" error={e.name} />
        <FormField label="Address" hint="Printed on purchase orders and invoices." error={e.address}>
          {(control) => <textarea name="address" rows={3} defaultValue={settings.address} autoComplete="street-address" className={inputClasses(Boolean(e.address))} {...control} />}
        </FormField>
      </Group>
      <Group title="Money" description="One currency for the whole shop. Amounts are in the currency’s main unit.">
        <TextField label="Currency" name="currency" defaultValue={settings.currency} hint="Three-letter code, e.g. GBP, EUR, USD." maxLength={3} autoCapitalize="characters" className="font-mono uppercase" error={e.currency} />
        <TextField label="Tax rate (%)" name="taxRatePercent" inputMode="decimal" defaultValue={String(settings.taxRatePercent)} hint="Added to sell prices, e.g. 20." error={e.taxRatePercent} />
        <TextField label={`Labour rate per hour (${currency})`} name="labourRateMinorPerHour" inputMode="decimal" defaultValue={minorToMajorText(settings.labourRateMinorPerHour)} hint="Charged for each hour booked on a job." error={e.labourRateMinorPerHour} />
      </Group>
      <Group title="Units" description="How distances and pressures are shown and entered.">
        <Select label="Distance" name="distanceUnit" defaultValue={settings.distanceUnit} options={distanceUnits.map((u) => ({ value: u, label: distanceLabels[u] }))} error={e.distanceUnit} />
        <Select label="Pressure" name="pressureUnit" defaultValue={settings.pressureUnit} options={pressureUnits.map((u) => ({ value: u, label: pressureLabels[u] }))} hint="Tyre pressures and compression readings." error={e.pressureUnit} />
      </Group>
      <Group title="Reordering" description="How the reorder list balances running out against money tied up on the shelves.">
        <TextField label="Service level" name="serviceLevel" inputMode="decimal" defaultValue={String(settings.serviceLevel)} hint="The chance of not running out while an order is on its way: 0.95 means 95 %. From 0.5 to 0.999." error={e.serviceLevel} />
        <TextField label={`Cost of placing one order (${currency})`} name="orderingCostMinor" inputMode="decimal" defaultValue={minorToMajorText(settings.orderingCostMinor)} hint="Time and postage per purchase order." error={e.orderingCostMinor} />
        <TextField label="Holding cost (% of stock value a year)" name="holdingCostRatePercent" inputMode="decimal" defaultValue={String(settings.holdingCostRatePercent)} hint="Space, insurance and money tied up, e.g. 25." error={e.holdingCostRatePercent} />
      </Group>
      <Group title="Labels" description="The sheets or roll the bin and part labels are printed on.">
        <Select label="Label sheet" name="labelSheetFormat" defaultValue={settings.labelSheetFormat} options={labelSheetFormats.map((f) => ({ value: f, label: labelSheetLabels[f] }))} hint="Everyone who prints labels starts with this format; one print may choose another." error={e.labelSheetFormat} />
      </Group>
      <div className="sticky bottom-0 -mx-1 flex flex-wrap items-center gap-3 border-t-2 border-line bg-ground px-1 py-3">
        <Button type="submit" loading={update.isPending}>
          Save settings
        </Button>
        <span className="text-sm text-ink-muted">Only the owner can change these. Every change is kept in the audit log.</span>
      </div>
    </form>
  );
}
