import { fitmentInputSchema, fitmentUpdateSchema, type Fitment } from '@tappet/contracts';
import { Dialog, FormMessage, TextField, useToast, FormDialogFooter } from '@tappet/ui';
import { useId, useRef, type FormEvent } from 'react';
import { formValues, useFormErrors, zodFieldErrors } from '../../../lib/forms';
import { useCreateFitment } from '../api/create-fitment';
import { useUpdateFitment } from '../api/update-fitment';
import { blankToNull, localValidationError, optionalNumber } from './form-bits';

const fields = ['marque', 'model', 'yearFrom', 'yearTo', 'frameFrom', 'frameTo'] as const;

export interface FitmentFormDialogProps {
  shopId: string;
  partId: string;
  partNumber: string;
  open: boolean;
  onClose: () => void;
  fitment?: Fitment;
}

/** Adds or edits what a part fits. */
export function FitmentFormDialog({ shopId, partId, partNumber, open, onClose, fitment }: FitmentFormDialogProps) {
  const formRef = useRef<HTMLFormElement>(null);
  const formId = useId();
  const errors = useFormErrors(formRef);
  const create = useCreateFitment(shopId);
  const update = useUpdateFitment(shopId);
  const toast = useToast();

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const values = formValues(event.currentTarget);
    const body = {
      marque: values.marque ?? '',
      model: values.model ?? '',
      yearFrom: optionalNumber(values.yearFrom),
      yearTo: optionalNumber(values.yearTo),
      frameFrom: blankToNull(values.frameFrom),
      frameTo: blankToNull(values.frameTo),
    };
    const parsed = fitment ? fitmentUpdateSchema.safeParse(body) : fitmentInputSchema.safeParse({ partId, ...body });
    if (!parsed.success) {
      const found = zodFieldErrors(parsed.error);
      for (const key of ['yearFrom', 'yearTo'] as const) {
        if (typeof body[key] === 'string' && found[key]) found[key] = 'Enter a year such as 1968, or leave it empty.';
      }
      if (!fitment && body.yearFrom != null && body.yearTo != null && body.yearFrom > body.yearTo) found.yearTo ??= 'The first year comes before the last.';
      return errors.failApi(localValidationError(found), fields);
    }
    errors.clear();
    const done = {
      onSuccess: () => {
        toast.show(fitment ? 'Fitment saved.' : `Fitment added to ${partNumber}.`, 'ok');
        onClose();
      },
      onError: (error: unknown) => errors.failApi(error, fields),
    };
    if (fitment) update.mutate({ fitmentId: fitment.id, input: parsed.data }, done);
    else create.mutate({ partId, ...(parsed.data as Omit<Fitment, 'id' | 'partId'>) }, done);
  }

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={fitment ? 'Edit the fitment' : `What does ${partNumber} fit?`}
      description="Frame numbers only where the part changed during a model's run."
      className="max-w-2xl"
      footer={<FormDialogFooter formId={formId} submitLabel={fitment ? 'Save fitment' : 'Add fitment'} loading={create.isPending || update.isPending} onCancel={onClose} />}
    >
      <form id={formId} ref={formRef} noValidate onSubmit={onSubmit} className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        {errors.formError && (
          <div className="sm:col-span-2">
            <FormMessage>{errors.formError}</FormMessage>
          </div>
        )}
        <TextField label="Marque" name="marque" defaultValue={fitment?.marque} error={errors.fieldErrors.marque} autoComplete="off" />
        <TextField label="Model" name="model" defaultValue={fitment?.model} error={errors.fieldErrors.model} autoComplete="off" />
        <TextField label="First year" name="yearFrom" inputMode="numeric" defaultValue={fitment?.yearFrom ?? ''} error={errors.fieldErrors.yearFrom} hint="Optional." className="font-mono" />
        <TextField label="Last year" name="yearTo" inputMode="numeric" defaultValue={fitment?.yearTo ?? ''} error={errors.fieldErrors.yearTo} hint="Optional." className="font-mono" />
        <TextField label="First frame number" name="frameFrom" defaultValue={fitment?.frameFrom ?? ''} error={errors.fieldErrors.frameFrom} hint="Optional." className="font-mono" autoComplete="off" />
        <TextField label="Last frame number" name="frameTo" defaultValue={fitment?.frameTo ?? ''} error={errors.fieldErrors.frameTo} hint="Optional." className="font-mono" autoComplete="off" />
      </form>
    </Dialog>
  );
}
