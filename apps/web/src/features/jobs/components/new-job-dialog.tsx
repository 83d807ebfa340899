import { jobInputSchema, type JobInput } from '@tappet/contracts';
import { Dialog, FormDialogFooter, FormMessage, Select, TextField, FormField, inputClasses } from '@tappet/ui';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError, errorMessage } from '../../../lib/api-client';
import { staffQueryOptions } from '../../staff/api/get-staff';
import { vehiclesQueryOptions } from '../../vehicles/api/get-vehicles';
import { useTemplates } from '../api/get-templates';
import { useCreateJob } from '../api/mutations';

/**
 * Opening a job (the owner): the vehicle, what the customer asked for, who works on it and
 * which checklists to start. Nothing typed is lost on a refused save.
 */
export function NewJobDialog({ shopId, open, onClose, onCreated, vehicleId }: { shopId: string; open: boolean; onClose: () => void; onCreated: (jobId: string) => void; vehicleId?: string }) {
  const vehicles = useQuery({ ...vehiclesQueryOptions(shopId, {}), enabled: open });
  const staff = useQuery({ ...staffQueryOptions(shopId), enabled: open });
  const templates = useTemplates(shopId, { enabled: open });
  const create = useCreateJob(shopId);
  const [form, setForm] = useState({ vehicleId: vehicleId ?? '', title: '', customerRequest: '', dueOn: '', assigneeIds: [] as string[], templateIds: [] as string[] });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const set = <K extends keyof typeof form>(key: K, value: (typeof form)[K]) => setForm((f) => ({ ...f, [key]: value }));
  const toggle = (key: 'assigneeIds' | 'templateIds', id: string) => set(key, form[key].includes(id) ? form[key].filter((x) => x !== id) : [...form[key], id]);

  const submit = async () => {
    const input: JobInput = { vehicleId: form.vehicleId, title: form.title, customerRequest: form.customerRequest, assigneeIds: form.assigneeIds, templateIds: form.templateIds, dueOn: form.dueOn || null };
    const checked = jobInputSchema.safeParse(input);
    if (!checked.success) {
      const next: Record<string, string> = {};
      for (const issue of checked.error.issues) next[String(issue.path[0])] ??= issue.path[0] === 'vehicleId' ? 'Choose the vehicle.' : issue.message;
      setErrors(next);
      return;
    }
    setErrors({});
    setFormError(null);
    try {
      const job = await create.mutateAsync(input);
      onCreated(job.id);
    } catch (error) {
      if (error instanceof ApiError) setErrors(error.fieldErrors);
      setFormError(errorMessage(error));
    }
  };

  const people = (staff.data?.members ?? []).filter((m) => m.isActive);
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="New job"
      footer={<FormDialogFooter onCancel={onClose} submitLabel="Open job" loading={create.isPending} formId="new-job-form" />}
    >
      <form
        id="new-job-form"
        noValidate
        className="flex flex-col gap-4"
        onSubmit={(e) => {
          e.preventDefault();
          void submit();
        }}
      >
        {formError && <FormMessage>{formError}</FormMessage>}
        <Select
          label="Vehicle"
          placeholder="Choose the vehicle"
          value={form.vehicleId}
          onChange={(e) => set('vehicleId', e.target.value)}
          error={errors['vehicleId']}
          options={(vehicles.data?.items ?? []).map((v) => ({ value: v.id, label: [v.year, v.marque, v.model, v.frameNumber].filter(Boolean).join(' ') }))}
        />
        <TextField label="Title" value={form.title} onChange={(e) => set('title', e.target.value)} error={errors['title']} maxLength={120} />
        <FormField label="What the customer asked for" error={errors['customerRequest']}>
          {(control) => <textarea {...control} rows={3} className={inputClasses(Boolean(errors['customerRequest']))} value={form.customerRequest} onChange={(e) => set('customerRequest', e.target.value)} maxLength={2000} />}
        </FormField>
        <TextField label="Due on" type="date" value={form.dueOn} onChange={(e) => set('dueOn', e.target.value)} error={errors['dueOn']} />
        <fieldset>
          <legend className="mb-1 font-bold">Assigned to</legend>
          {people.length === 0 && <p className="text-ink-muted">{staff.isPending ? 'Loading staff…' : 'No staff to assign.'}</p>}
          <div className="flex flex-wrap gap-2">
            {people.map((m) => (
              <label key={m.userId} className="inline-flex min-h-touch items-center gap-2 rounded-md border-2 border-line-strong px-3">
                <input type="checkbox" className="h-5 w-5" checked={form.assigneeIds.includes(m.userId)} onChange={() => toggle('assigneeIds', m.userId)} />
                {m.name} <span className="text-ink-muted">({m.role})</span>
              </label>
            ))}
          </div>
        </fieldset>
        <fieldset>
          <legend className="mb-1 font-bold">Checklists to start</legend>
          <div className="flex flex-wrap gap-2">
            {(templates.data?.templates ?? [])
              .filter((t) => !t.archived)
              .map((t) => (
                <label key={t.id} className="inline-flex min-h-touch items-center gap-2 rounded-md border-2 border-line-strong px-3">
                  <input type="checkbox" className="h-5 w-5" checked={form.templateIds.includes(t.id)} onChange={() => toggle('templateIds', t.id)} />
                  {t.name}
                </label>
              ))}
          </div>
        </fieldset>
      </form>
    </Dialog>
  );
}
