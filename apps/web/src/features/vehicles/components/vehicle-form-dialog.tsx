import { vehicleConditions, vehicleInputSchema, vehicleKinds, vehicleUpdateSchema, type VehicleDetail, type VehicleInput, type VehicleKind } from '@tappet/contracts';
import { formatMinorUnits, minorUnitExponent, parseMinorUnits } from '@tappet/domain';
import { Dialog, FormDialogFooter, FormMessage, Select, TextField, useToast } from '@tappet/ui';
import { useId, useRef, useState, type FormEvent } from 'react';
import { ApiError } from '../../../lib/api-client';
import { formValues, useFormErrors, zodFieldErrors, type FieldErrors } from '../../../lib/forms';
import { useCreateVehicle, useUpdateVehicle } from '../api/mutations';
import { CustomerPicker } from './customer-picker';
import { blankToNull, optionalInteger, TextAreaField } from './form-bits';
import { conditionWords, kindWords } from './words';

const fields = ['kind', 'marque', 'model', 'year', 'colour', 'frameNumber', 'engineNumber', 'vin', 'condition', 'notes', 'customerId', 'acquisitionCostMinor', 'askingPriceMinor', 'arrivedOn', 'odometer.value', 'odometer.readOn'] as const;

/** The check-digit warning the API sends for a 17-character VIN that does not add up. */
export interface VinWarning {
  vin: string;
  expected: string | null;
  message: string;
}

/** Reads the API's VIN warning out of an error, or null. */
export function vinWarningOf(error: unknown, vin: string): VinWarning | null {
  if (!(error instanceof ApiError) || !Array.isArray(error.details)) return null;
  const item = (error.details as Array<Record<string, unknown>>).find((d) => d?.['warning'] === 'vin_check_digit');
  if (!item) return null;
  return { vin, expected: typeof item['expected'] === 'string' ? item['expected'] : null, message: error.message };
}

/** Money typed in major units ("4,200.00") as minor units; NaN when it is not an amount. */
function moneyFrom(text: string | undefined, exponent: number): number | null {
  const trimmed = (text ?? '').replace(/[,\s£$€]/g, '');
  if (!trimmed) return null;
  try {
    return parseMinorUnits(trimmed, exponent);
  } catch {
    return Number.NaN;
  }
}

export interface VehicleFormDialogProps {
  shopId: string;
  open: boolean;
  onClose: () => void;
  /** The vehicle to edit; without it the form records a new arrival. */
  vehicle?: VehicleDetail;
  /** The shop's currency (ISO 4217) and distance unit. */
  currency: string;
  distanceUnit: 'mi' | 'km';
  /** Whether the person may set the acquisition cost and asking price (not mechanics). */
  canSetMoney: boolean;
  /** Whether the person may add customers. */
  canCreateCustomer: boolean;
  marques?: string[];
  onSaved?: (vehicle: VehicleDetail) => void;
}

/**
 * Records or edits a vehicle. A 17-character VIN whose check digit fails comes back as a warning
 * that must be confirmed with a tick before the form is sent again; it is never kept silently.
 */
export function VehicleFormDialog({ shopId, open, onClose, vehicle, currency, distanceUnit, canSetMoney, canCreateCustomer, marques = [], onSaved }: VehicleFormDialogProps) {
  const formRef = useRef<HTMLFormElement>(null);
  const formId = useId();
  const listId = useId();
  const errors = useFormErrors(formRef);
  const create = useCreateVehicle(shopId);
  const update = useUpdateVehicle(shopId, vehicle?.id ?? '');
  const toast = useToast();
  const [kind, setKind] = useState<VehicleKind>(vehicle?.kind ?? 'customer');
  const [customer, setCustomer] = useState<{ id: string; name: string } | null>(vehicle?.customer ?? null);
  const [vinWarning, setVinWarning] = useState<VinWarning | null>(null);
  const [vinConfirmed, setVinConfirmed] = useState(false);
  const exponent = minorUnitExponent(currency);
  const money = (minor: number | null | undefined) => (minor == null ? '' : formatMinorUnits(minor, exponent));

  function build(values: Record<string, string>): VehicleInput {
    const vin = (values['vin'] ?? '').trim().toUpperCase();
    const odometerValue = optionalInteger(values['odometerValue']);
    return {
      kind,
      marque: values['marque'] ?? '',
      model: values['model'] ?? '',
      year: optionalInteger(values['year']),
      colour: blankToNull(values['colour']),
      frameNumber: blankToNull(values['frameNumber']),
      engineNumber: blankToNull(values['engineNumber']),
      vin: vin || null,
      condition: (values['condition'] || null) as VehicleInput['condition'],
      notes: blankToNull(values['notes']),
      customerId: customer?.id ?? null,
      // Only the fields the person may set are sent at all.
      ...(canSetMoney
        ? {
            acquisitionCostMinor: kind === 'shop_stock' ? moneyFrom(values['acquisitionCost'], exponent) : null,
            askingPriceMinor: kind === 'customer' ? null : moneyFrom(values['askingPrice'], exponent),
          }
        : {}),
      acknowledgeCheckDigit: Boolean(vinWarning && vinConfirmed && vinWarning.vin === vin),
      ...(!vehicle && odometerValue !== null ? { odometer: { value: odometerValue, unit: (values['odometerUnit'] || distanceUnit) as 'mi' | 'km', readOn: values['odometerReadOn'] || values['arrivedOn'] || new Date().toISOString().slice(0, 10) } } : {}),
      ...(!vehicle && values['arrivedOn'] ? { arrivedOn: values['arrivedOn'] } : {}),
    };
  }

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const input = build(formValues(event.currentTarget));
    const parsed = (vehicle ? vehicleUpdateSchema : vehicleInputSchema).safeParse(input);
    if (!parsed.success) {
      const fe: FieldErrors = zodFieldErrors(parsed.error);
      errors.failApi(new ApiError(400, 'validation_failed', 'Check the fields marked below.', fe), fields);
      return;
    }
    if (vinWarning && vinWarning.vin === input.vin && !vinConfirmed) {
      errors.failApi(new ApiError(400, 'validation_failed', 'Confirm the VIN below, or correct it.', { vin: 'Confirm or correct this VIN.' }), fields);
      return;
    }
    errors.clear();
    const callbacks = {
      onSuccess: (saved: VehicleDetail) => {
        toast.show(vehicle ? 'Vehicle saved.' : 'Vehicle recorded as arrived.', 'ok');
        onSaved?.(saved);
        onClose();
      },
      onError: (error: unknown) => {
        const warning = vinWarningOf(error, input.vin ?? '');
        if (warning) {
          setVinWarning(warning);
          setVinConfirmed(false);
          errors.failApi(new ApiError(400, 'validation_failed', warning.message, { vin: `The check digit (position 9) should be ${warning.expected ?? '?'}.` }), fields);
          return;
        }
        errors.failApi(error, fields);
      },
    };
    if (vehicle) update.mutate(input, callbacks);
    else create.mutate(input, callbacks);
  }

  const pending = create.isPending || update.isPending;

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={vehicle ? 'Edit vehicle' : 'Record a vehicle'}
      description="Numbers as stamped on the frame and engine; older vehicles have no VIN."
      className="max-w-3xl"
      footer={<FormDialogFooter formId={formId} submitLabel={vehicle ? 'Save vehicle' : 'Record vehicle'} loading={pending} onCancel={onClose} />}
    >
      <form id={formId} ref={formRef} noValidate onSubmit={onSubmit} className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        {errors.formError && (
          <div className="sm:col-span-2">
            <FormMessage>{errors.formError}</FormMessage>
          </div>
        )}
        <Select label="Kind" name="kind" value={kind} onChange={(e) => setKind(e.currentTarget.value as VehicleKind)} options={vehicleKinds.map((k) => ({ value: k, label: kindWords[k] }))} error={errors.fieldErrors['kind']} />
        <Select
          label="Condition"
          name="condition"
          defaultValue={vehicle?.condition ?? ''}
          options={[{ value: '', label: 'Not judged yet' }, ...vehicleConditions.map((c) => ({ value: c, label: `${conditionWords[c].label} — ${conditionWords[c].meaning}` }))]}
          error={errors.fieldErrors['condition']}
        />
        <TextField label="Marque" name="marque" defaultValue={vehicle?.marque} list={listId} error={errors.fieldErrors['marque']} autoComplete="off" />
        <datalist id={listId}>
          {marques.map((m) => (
            <option key={m} value={m} />
          ))}
        </datalist>
        <TextField label="Model" name="model" defaultValue={vehicle?.model} error={errors.fieldErrors['model']} autoComplete="off" />
        <TextField label="Year" name="year" inputMode="numeric" defaultValue={vehicle?.year ?? ''} error={errors.fieldErrors['year']} hint="Optional; year of manufacture." autoComplete="off" />
        <TextField label="Colour" name="colour" defaultValue={vehicle?.colour ?? ''} error={errors.fieldErrors['colour']} hint="Optional." autoComplete="off" />
        <TextField label="Frame number" name="frameNumber" defaultValue={vehicle?.frameNumber ?? ''} error={errors.fieldErrors['frameNumber']} className="font-mono" hint="As stamped, with its spacing." autoComplete="off" spellCheck={false} />
        <TextField label="Engine number" name="engineNumber" defaultValue={vehicle?.engineNumber ?? ''} error={errors.fieldErrors['engineNumber']} className="font-mono" hint="As stamped." autoComplete="off" spellCheck={false} />
        <div className="flex flex-col gap-2 sm:col-span-2">
          <TextField
            label="VIN"
            name="vin"
            defaultValue={vehicle?.vin ?? ''}
            error={errors.fieldErrors['vin']}
            className="font-mono uppercase"
            hint="Only from the 1980s on; 17 characters, never I, O or Q. Leave empty for older vehicles."
            maxLength={20}
            autoComplete="off"
            spellCheck={false}
            onChange={() => {
              if (vinWarning) setVinConfirmed(false);
            }}
          />
          {vinWarning && (
            <div className="rounded-md border-2 border-advise bg-advise-soft p-3" role="alert">
              <p className="font-bold">
                <span aria-hidden="true">⚠ </span>The VIN’s check digit does not match
              </p>
              <p className="mt-1">
                Position 9 of <span className="font-mono">{vinWarning.vin}</span> should be <span className="font-mono font-bold">{vinWarning.expected ?? '?'}</span>. Vehicles built for North America must carry a valid check digit: look at the stamping again. Keep it only if the vehicle really carries this VIN.
              </p>
              <label className="mt-2 flex min-h-touch items-center gap-3">
                <input type="checkbox" className="h-5 w-5 accent-accent" checked={vinConfirmed} onChange={(e) => setVinConfirmed(e.currentTarget.checked)} />
                I have checked the vehicle: keep this VIN as stamped
              </label>
            </div>
          )}
        </div>
        <div className="sm:col-span-2">
          <CustomerPicker shopId={shopId} value={customer} onChange={setCustomer} canCreate={canCreateCustomer} label={kind === 'consignment' ? 'Consignor' : kind === 'customer' ? 'Owner' : 'Bought from (optional)'} error={errors.fieldErrors['customerId']} />
        </div>
        {kind !== 'customer' && (
          <>
            {kind === 'shop_stock' && (
              <TextField
                label={`Acquisition cost (${currency})`}
                name="acquisitionCost"
                inputMode="decimal"
                defaultValue={money(vehicle?.acquisitionCostMinor)}
                disabled={!canSetMoney}
                error={errors.fieldErrors['acquisitionCostMinor']}
                hint={canSetMoney ? 'What the shop paid.' : 'Only the owner sets this.'}
                autoComplete="off"
              />
            )}
            <TextField
              label={`Asking price (${currency})`}
              name="askingPrice"
              inputMode="decimal"
              defaultValue={money(vehicle?.askingPriceMinor)}
              disabled={!canSetMoney}
              error={errors.fieldErrors['askingPriceMinor']}
              hint={canSetMoney ? 'Optional.' : 'Only the owner sets this.'}
              autoComplete="off"
            />
          </>
        )}
        {!vehicle && (
          <fieldset className="grid grid-cols-1 gap-4 rounded-md border border-line p-3 sm:col-span-2 sm:grid-cols-3">
            <legend className="px-1 font-bold">On arrival</legend>
            <TextField label="Arrived on" name="arrivedOn" type="date" error={errors.fieldErrors['arrivedOn']} hint="Today if left empty." />
            <TextField label="Odometer" name="odometerValue" inputMode="numeric" error={errors.fieldErrors['odometer.value']} hint="Optional; as the clock reads." autoComplete="off" />
            <Select label="Unit" name="odometerUnit" defaultValue={distanceUnit} options={[{ value: 'mi', label: 'miles (mi)' }, { value: 'km', label: 'kilometres (km)' }]} />
          </fieldset>
        )}
        <div className="sm:col-span-2">
          <TextAreaField label="Notes" name="notes" defaultValue={vehicle?.notes ?? ''} error={errors.fieldErrors['notes']} hint="Optional: history, what the customer asked for." />
        </div>
      </form>
    </Dialog>
  );
}
