import type { JobDetail } from '@tappet/contracts';
import { Dialog, FormDialogFooter, FormMessage } from '@tappet/ui';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { staffQueryOptions } from '../../staff/api/get-staff';
import { useUpdateJob } from '../api/mutations';

/** The owner changes who works on a job: the people ticked are assigned, the others are not. */
export function AssignDialog({ shopId, job, onClose }: { shopId: string; job: JobDetail; onClose: () => void }) {
  const staff = useQuery(staffQueryOptions(shopId));
  const update = useUpdateJob(shopId, job.id);
  const [chosen, setChosen] = useState<string[]>(job.assignees.map((a) => a.id));
  const [error, setError] = useState<string | null>(null);
  const people = (staff.data?.members ?? []).filter((m) => m.isActive);
  const toggle = (id: string) => setChosen((c) => (c.includes(id) ? c.filter((x) => x !== id) : [...c, id]));
  return (
    <Dialog
      open
      onClose={onClose}
      title={`Who works on job ${job.number}`}
      description="A mechanic records checklists, parts and labour only on jobs they are assigned to."
      footer={<FormDialogFooter formId="assign-form" submitLabel="Save" loading={update.isPending} onCancel={onClose} />}
    >
      <form
        id="assign-form"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          update.mutateAsync({ assigneeIds: chosen }).then(onClose, (err: unknown) => setError(errorMessage(err)));
        }}
      >
        {error && <FormMessage>{error}</FormMessage>}
        <fieldset>
          <legend className="mb-2 font-bold">Assigned to</legend>
          {staff.isPending && <p className="text-ink-muted">Loading staff…</p>}
          {staff.isError && <FormMessage>{errorMessage(staff.error)}</FormMessage>}
          <div className="flex flex-col gap-2">
            {people.map((m) => (
              <label key={m.userId} className="inline-flex min-h-touch items-center gap-2 rounded-md border-2 border-line-strong px-3">
                <input type="checkbox" className="h-5 w-5" checked={chosen.includes(m.userId)} onChange={() => toggle(m.userId)} />
                {m.name} <span className="text-ink-muted">({m.role})</span>
              </label>
            ))}
          </div>
        </fieldset>
      </form>
    </Dialog>
  );
}
