import { purchasingSettingsSchema } from '@tappet/contracts';
import { Button, FormMessage, TextField, useToast } from '@tappet/ui';
import { useState, type FormEvent } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { updatePurchasingSettings, usePurchasingSettings } from '../api/purchasing-settings';
import { usePurchasingMutation } from '../api/purchasing-mutation';

/** The owner's two reorder settings kept here (service level and costs are in the shop settings). */
export function ReorderSettings({ shopId }: { shopId: string }) {
  const settings = usePurchasingSettings(shopId);
  const save = usePurchasingMutation(shopId, updatePurchasingSettings);
  const toast = useToast();
  const [errors, setErrors] = useState<Record<string, string>>({});
  if (!settings.data) return null;
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const f = new FormData(event.currentTarget);
    const parsed = purchasingSettingsSchema.safeParse({ demandWindowDays: Number(f.get('demandWindowDays')), deadStockDays: Number(f.get('deadStockDays')) });
    if (!parsed.success) return setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])));
    setErrors({});
    save.mutate(parsed.data, { onSuccess: () => toast.show('Reorder settings saved.', 'ok'), onError: (e) => setErrors({ form: errorMessage(e) }) });
  }
  return (
    <details className="mb-6 rounded-md border-2 border-line p-3">
      <summary className="min-h-touch cursor-pointer font-bold">Reorder settings</summary>
      <form noValidate onSubmit={onSubmit} className="mt-3 flex flex-wrap items-end gap-4">
        {errors['form'] && <FormMessage>{errors['form']}</FormMessage>}
        <TextField label="Demand window (days)" name="demandWindowDays" inputMode="numeric" defaultValue={String(settings.data.demandWindowDays)} error={errors['demandWindowDays']} />
        <TextField label="Dead stock after (days without issues)" name="deadStockDays" inputMode="numeric" defaultValue={String(settings.data.deadStockDays)} error={errors['deadStockDays']} />
        <Button type="submit" loading={save.isPending}>
          Save settings
        </Button>
      </form>
    </details>
  );
}
