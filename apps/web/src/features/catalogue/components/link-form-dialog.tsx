import { interchanges, linkInputSchema, linkKinds, linkUpdateSchema, type Part, type PartLink } from '@tappet/contracts';
import { Dialog, FormMessage, PartNumber, Select, TextField, useToast, FormDialogFooter } from '@tappet/ui';
import { useId, useRef, useState, type FormEvent } from 'react';
import { formValues, useFormErrors, zodFieldErrors } from '../../../lib/forms';
import { useCreateLink, type LinkInput } from '../api/create-link';
import { useUpdateLink } from '../api/update-link';
import { blankToNull, localValidationError, TextAreaField } from './form-bits';
import { PartPicker, type PickedPart } from './part-picker';
import { interchangeWords, kindChoices, kindWords } from './words';

type Kind = PartLink['kind'];
type Interchange = PartLink['interchange'];
const fields = ['kind', 'toPartId', 'toNumber', 'quantity', 'interchange', 'effectiveDate', 'sourceReference', 'note'] as const;

function quantityFrom(text: string | undefined): number | undefined {
  const trimmed = text?.trim().replace(',', '.') ?? '';
  if (!trimmed) return 1;
  const n = Number(trimmed);
  return Number.isFinite(n) ? n : undefined;
}

export interface LinkFormDialogProps {
  shopId: string;
  open: boolean;
  onClose: () => void;
  /** The part the new link starts from. */
  from: Part;
  /** The link to edit; its ends and kind stay as they are. */
  link?: PartLink;
}

/** Adds a link from a part (replaced by, kit contains, equivalent) or edits one. */
export function LinkFormDialog({ shopId, open, onClose, from, link }: LinkFormDialogProps) {
  const formRef = useRef<HTMLFormElement>(null);
  const formId = useId();
  const errors = useFormErrors(formRef);
  const create = useCreateLink(shopId);
  const update = useUpdateLink(shopId);
  const toast = useToast();
  const [kind, setKind] = useState<Kind>(link?.kind ?? 'replaced_by');
  const [target, setTarget] = useState<PickedPart | null>(null);

  // An equivalent is either both ways or one way; a kit's contents have no interchange.
  const interchangeOptions = interchanges.filter((i) => kind !== 'equivalent' || i !== 'with_changes').map((i) => ({ value: i, label: interchangeWords(kind, i) }));

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const values = formValues(event.currentTarget);
    const quantity = quantityFrom(values.quantity);
    if (quantity === undefined) {
      errors.failApi(localValidationError({ quantity: 'Enter the quantity as a number, e.g. 2 or 0.5.' }), fields);
      return;
    }
    const common = {
      quantity,
      interchange: (kind === 'kit_contains' ? 'both' : values.interchange || 'both') as Interchange,
      effectiveDate: values.effectiveDate?.trim() || null,
      sourceReference: blankToNull(values.sourceReference),
      note: blankToNull(values.note),
    };

    if (link) {
      const parsed = linkUpdateSchema.safeParse(common);
      if (!parsed.success) return errors.failApi(localValidationError(zodFieldErrors(parsed.error)), fields);
      errors.clear();
      update.mutate(
        { linkId: link.id, input: common },
        {
          onSuccess: () => {
            toast.show('Link saved.', 'ok');
            onClose();
          },
          onError: (error) => errors.failApi(error, fields),
        },
      );
      return;
    }

    const input: LinkInput = {
      fromPartId: from.id,
      kind,
      ...(target?.partId ? { toPartId: target.partId } : target ? { toNumber: target.number } : {}),
      ...common,
    };
    const parsed = linkInputSchema.safeParse(input);
    if (!parsed.success) {
      const found = zodFieldErrors(parsed.error);
      // The picker answers for both ways of naming the other part.
      if (!target) found.toPartId = 'Choose the other part, or use the number as typed.';
      else if (found.toNumber && !found.toPartId) found.toPartId = found.toNumber;
      return errors.failApi(localValidationError(found), fields);
    }
    errors.clear();
    create.mutate(input, {
      onSuccess: (saved) => {
        toast.show(`Linked: ${saved.fromNumber} ${kindWords[saved.kind]} ${saved.toNumber}.`, 'ok');
        onClose();
      },
      onError: (error) => errors.failApi(error, fields),
    });
  }

  const targetError = errors.fieldErrors.toPartId ?? errors.fieldErrors.toNumber;

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={link ? 'Edit the link' : `Link ${from.number} to another part`}
      className="max-w-2xl"
      footer={<FormDialogFooter formId={formId} submitLabel={link ? 'Save link' : 'Add link'} loading={create.isPending || update.isPending} onCancel={onClose} />}
    >
      <form id={formId} ref={formRef} noValidate onSubmit={onSubmit} className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        {errors.formError && (
          <div className="sm:col-span-2">
            <FormMessage>{errors.formError}</FormMessage>
          </div>
        )}
        {link ? (
          <p className="sm:col-span-2">
            <PartNumber>{link.fromNumber}</PartNumber> {kindWords[link.kind]} <PartNumber>{link.toNumber}</PartNumber>. To change the parts or
            the kind, delete this link and add a new one.
          </p>
        ) : (
          <>
            <Select
              label="Kind of link"
              name="kind"
              value={kind}
              onChange={(e) => setKind(e.target.value as Kind)}
              options={linkKinds.map((k) => ({ value: k, label: kindChoices[k] }))}
              error={errors.fieldErrors.kind}
              hint={`Read as: ${from.number} ${kindWords[kind]} …`}
              fieldClassName="sm:col-span-2"
            />
            <div className="sm:col-span-2">
              <PartPicker shopId={shopId} label="Other part" value={target} onChange={setTarget} excludePartId={from.id} error={targetError} />
            </div>
          </>
        )}
        <TextField
          label="Quantity"
          name="quantity"
          inputMode="decimal"
          defaultValue={link ? String(link.quantity) : '1'}
          error={errors.fieldErrors.quantity}
          hint={kind === 'kit_contains' ? 'How many are in one kit.' : 'How many of the other part take the place of one of this.'}
          className="font-mono"
        />
        {kind !== 'kit_contains' && (
          <Select
            key={kind}
            label="Interchange"
            name="interchange"
            defaultValue={link?.interchange === 'with_changes' && kind === 'equivalent' ? 'both' : (link?.interchange ?? 'both')}
            options={interchangeOptions}
            error={errors.fieldErrors.interchange}
          />
        )}
        <TextField label="Effective date" name="effectiveDate" type="date" defaultValue={link?.effectiveDate ?? ''} error={errors.fieldErrors.effectiveDate} hint="Optional." />
        <TextField
          label="Source reference"
          name="sourceReference"
          defaultValue={link?.sourceReference ?? ''}
          error={errors.fieldErrors.sourceReference}
          hint="Optional: a service bulletin or parts-book page."
          autoComplete="off"
        />
        <div className="sm:col-span-2">
          <TextAreaField label="Note" name="note" defaultValue={link?.note ?? ''} error={errors.fieldErrors.note} hint="Optional." />
        </div>
      </form>
    </Dialog>
  );
}
