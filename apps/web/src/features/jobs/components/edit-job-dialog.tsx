import { jobUpdateSchema, type JobDetail, type JobUpdate } from '@tappet/contracts';
import { Dialog, FormDialogFooter, FormField, FormMessage, TextField, inputClasses } from '@tappet/ui';
import { useState } from 'react';
import { ApiError, errorMessage } from '../../../lib/api-client';
import { useUpdateJob } from '../api/mutations';

/** Changing what a job is: its title, what the customer asked for, the due date and notes. Nothing typed is lost on a refused save. */
export function EditJobDialog({ shopId, job, onClose }: { shopId: string; job: JobDetail; onClose: () => void }) {
  const update = useUpdateJob(shopId, job.id);
  const [form, setForm] = useState({ title: job.title, customerRequest: job.customerRequest, dueOn: job.dueOn ?? '', notes: job.notes ?? '' });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const set = <K extends keyof typeof form>(key: K, value: string) => setForm((f) => ({ ...f, [key]: value }));

  const submit = async () => {
    const input: JobUpdate = { title: form.title, customerRequest: form.customerRequest, dueOn: form.dueOn || null, notes: form.notes || null };
    const checked = jobUpdateSchema.safeParse(input);
    if (!checked.success) {
      const next: Record<string, string> = {};
      for (const issue of checked.error.issues) next[String(issue.path[0])] ??= issue.message;
      setErrors(next);
      return;
    }
    setErrors({});
    setFormError(null);
    try {
      await update.mutateAsync(input);
      onClose();
    } catch (error) {
      if (error instanceof ApiError) setErrors(error.fieldErrors);
      setFormError(errorMessage(error));
    }
  };

  return (
    <Dialog open onClose={onClose} title={`Edit job ${job.number}`} footer={<FormDialogFooter formId="edit-job-form" submitLabel="Save" loading={update.isPending} onCancel={onClose} />}>
      <form
        id="edit-job-form"
        noValidate
        className="flex flex-col gap-4"
        onSubmit={(e) => {
          e.preventDefault();
          void submit();
        }}
      >
        {formError && <FormMessage>{formError}</FormMessage>}
        <TextField label="Title" value={form.title} onChange={(e) => set('title', e.target.value)} error={errors['title']} maxLength={120} />
        <FormField label="What the customer asked for" error={errors['customerRequest']}>
          {(control) => <textarea {...control} rows={3} className={inputClasses(Boolean(errors['customerRequest']))} value={form.customerRequest} onChange={(e) => set('customerRequest', e.target.value)} maxLength={2000} />}
        </FormField>
        <TextField label="Due on" type="date" value={form.dueOn} onChange={(e) => set('dueOn', e.target.value)} error={errors['dueOn']} />
        <FormField label="Notes" error={errors['notes']}>
          {(control) => <textarea {...control} rows={4} className={inputClasses(Boolean(errors['notes']))} value={form.notes} onChange={(e) => set('notes', e.target.value)} maxLength={4000} />}
        </FormField>
      </form>
    </Dialog>
  );
}
