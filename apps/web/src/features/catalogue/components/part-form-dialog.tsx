import { partInputSchema, partOrigins, partStatuses, type Part, type PartInput } from '@tappet/contracts';
import { Dialog, FormMessage, Select, TextField, useToast, FormDialogFooter } from '@tappet/ui';
import { useId, useRef, type FormEvent } from 'react';
import { formValues, useFormErrors, zodFieldErrors } from '../../../lib/forms';
import { useCreatePart } from '../api/create-part';
import { useUpdatePart } from '../api/update-part';
import { blankToNull, collapseApiListErrors, collapseListErrors, localValidationError, TextAreaField } from './form-bits';
import { originWords, statusWordsOf } from './words';

const fields = ['number', 'description', 'origin', 'maker', 'category', 'unit', 'status', 'notes', 'supplierNumbers'] as const;

/** Turns the form's strings into the API's part input (supplier numbers one per line, or separated by commas or semicolons). */
export function partInputFrom(values: Record<string, string>): PartInput {
  return {
    number: values.number ?? '',
    description: values.description ?? '',
    origin: (values.origin || 'genuine') as PartInput['origin'],
    maker: blankToNull(values.maker),
    category: blankToNull(values.category),
    unit: values.unit?.trim() || 'each',
    status: (values.status || 'available') as PartInput['status'],
    notes: blankToNull(values.notes),
    supplierNumbers: (values.supplierNumbers ?? '')
      .split(/[\n,;]/)
      .map((s) => s.trim())
      .filter(Boolean),
  };
}

export interface PartFormDialogProps {
  shopId: string;
  open: boolean;
  onClose: () => void;
  /** The part to edit; without it the form adds a new part. */
  part?: Part;
  /** Categories already in use, offered while typing. */
  categories?: string[];
  onSaved?: (part: Part) => void;
}

/** Adds or edits a part, checked with the API's own schema before it is sent. */
export function PartFormDialog({ shopId, open, onClose, part, categories = [], onSaved }: PartFormDialogProps) {
  const formRef = useRef<HTMLFormElement>(null);
  const formId = useId();
  const listId = useId();
  const errors = useFormErrors(formRef);
  const create = useCreatePart(shopId);
  const update = useUpdatePart(shopId, part?.id ?? '');
  const toast = useToast();

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const input = partInputFrom(formValues(event.currentTarget));
    const parsed = partInputSchema.safeParse(input);
    if (!parsed.success) {
      errors.failApi(localValidationError(collapseListErrors(zodFieldErrors(parsed.error), ['supplierNumbers'])), fields);
      return;
    }
    errors.clear();
    const callbacks = {
      onSuccess: (saved: Part) => {
        toast.show(part ? `Saved ${saved.number}.` : `Added ${saved.number} to the catalogue.`, 'ok');
        onSaved?.(saved);
        onClose();
      },
      onError: (error: unknown) => errors.failApi(collapseApiListErrors(error, ['supplierNumbers']), fields),
    };
    if (part) update.mutate(input, callbacks);
    else create.mutate(input, callbacks);
  }

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={part ? `Edit ${part.number}` : 'Add a part'}
      description="The number as printed in the parts book or on the part; separators are kept."
      className="max-w-2xl"
      footer={<FormDialogFooter formId={formId} submitLabel={part ? 'Save part' : 'Add part'} loading={create.isPending || update.isPending} onCancel={onClose} />}
    >
      <form id={formId} ref={formRef} noValidate onSubmit={onSubmit} className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        {errors.formError && (
          <div className="sm:col-span-2">
            <FormMessage>{errors.formError}</FormMessage>
          </div>
        )}
        <TextField label="Part number" name="number" defaultValue={part?.number} error={errors.fieldErrors.number} className="font-mono" autoComplete="off" spellCheck={false} />
        <TextField label="Description" name="description" defaultValue={part?.description} error={errors.fieldErrors.description} autoComplete="off" />
        <Select label="Origin" name="origin" defaultValue={part?.origin ?? 'genuine'} options={partOrigins.map((o) => ({ value: o, label: originWords[o] }))} error={errors.fieldErrors.origin} />
        <Select label="Status" name="status" defaultValue={part?.status ?? 'available'} options={partStatuses.map((s) => ({ value: s, label: statusWordsOf[s] }))} error={errors.fieldErrors.status} />
        <TextField label="Maker" name="maker" defaultValue={part?.maker ?? ''} error={errors.fieldErrors.maker} hint="Optional." autoComplete="off" />
        <TextField label="Category" name="category" defaultValue={part?.category ?? ''} error={errors.fieldErrors.category} hint="Optional, e.g. Brakes." list={listId} autoComplete="off" />
        <datalist id={listId}>
          {categories.map((c) => (
            <option key={c} value={c} />
          ))}
        </datalist>
        <TextField label="Unit" name="unit" defaultValue={part?.unit ?? 'each'} error={errors.fieldErrors.unit} hint="How it is counted: each, pair, set, metre…" autoComplete="off" />
        <TextField
          label="Supplier numbers"
          name="supplierNumbers"
          defaultValue={part?.supplierNumbers.join(', ') ?? ''}
          error={errors.fieldErrors.supplierNumbers}
          hint="Optional. Separate several with commas."
          className="font-mono"
          autoComplete="off"
          spellCheck={false}
        />
        <div className="sm:col-span-2">
          <TextAreaField label="Notes" name="notes" defaultValue={part?.notes ?? ''} error={errors.fieldErrors.notes} hint="Optional." />
        </div>
      </form>
    </Dialog>
  );
}
