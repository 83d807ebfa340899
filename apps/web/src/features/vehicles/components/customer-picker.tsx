import { customerInputSchema, type Customer } from '@tappet/contracts';
import { Button, FormMessage, Select, TextField } from '@tappet/ui';
import { useState } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { zodFieldErrors, type FieldErrors } from '../../../lib/forms';
import { useCreateCustomer, useCustomers } from '../api/customers';

export interface CustomerPickerProps {
  shopId: string;
  /** The chosen customer (id and name), or null. */
  value: { id: string; name: string } | null;
  onChange: (customer: { id: string; name: string } | null) => void;
  /** Whether the person may add customers (the owner). */
  canCreate: boolean;
  label: string;
  error?: string;
}

/**
 * Picks the vehicle's owner or consignor: type to narrow the list, choose one, or add a new
 * customer on the spot (name, e-mail, phone) without leaving the vehicle form.
 */
export function CustomerPicker({ shopId, value, onChange, canCreate, label, error }: CustomerPickerProps) {
  const [q, setQ] = useState('');
  const [adding, setAdding] = useState(false);
  const [draft, setDraft] = useState({ name: '', email: '', phone: '' });
  const [draftErrors, setDraftErrors] = useState<FieldErrors>({});
  const customers = useCustomers(shopId, q.trim());
  const create = useCreateCustomer(shopId);
  const found = customers.data?.items ?? [];
  const options = [...(value && !found.some((c) => c.id === value.id) ? [value] : []), ...found];

  function add() {
    const parsed = customerInputSchema.safeParse({ name: draft.name, email: draft.email, phone: draft.phone });
    if (!parsed.success) {
      setDraftErrors(zodFieldErrors(parsed.error));
      return;
    }
    setDraftErrors({});
    create.mutate(
      { name: draft.name, email: draft.email || null, phone: draft.phone || null },
      {
        onSuccess: (c: Customer) => {
          onChange({ id: c.id, name: c.name });
          setAdding(false);
          setDraft({ name: '', email: '', phone: '' });
        },
      },
    );
  }

  return (
    <fieldset className="flex flex-col gap-3 rounded-md border border-line p-3">
      <legend className="px-1 font-bold">{label}</legend>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <TextField label="Find a customer" type="search" value={q} onChange={(e) => setQ(e.currentTarget.value)} hint="Name, e-mail or phone." autoComplete="off" />
        <Select
          label="Customer"
          value={value?.id ?? ''}
          error={error}
          onChange={(e) => {
            const id = e.currentTarget.value;
            const picked = options.find((c) => c.id === id);
            onChange(picked ? { id: picked.id, name: picked.name } : null);
          }}
          options={[{ value: '', label: customers.isPending ? 'Loading…' : 'None' }, ...options.map((c) => ({ value: c.id, label: c.name }))]}
        />
      </div>
      {canCreate && !adding && (
        <div>
          <Button type="button" variant="secondary" size="sm" onClick={() => setAdding(true)}>
            New customer…
          </Button>
        </div>
      )}
      {adding && (
        <div className="flex flex-col gap-3 rounded-md bg-sunk p-3" role="group" aria-label="New customer">
          {create.isError && <FormMessage>{errorMessage(create.error)}</FormMessage>}
          <div className="grid grid-cols-1 gap-3 sm:grid-cols-3">
            <TextField label="Name" value={draft.name} onChange={(e) => setDraft({ ...draft, name: e.currentTarget.value })} error={draftErrors.name} autoComplete="off" />
            <TextField label="E-mail" type="email" value={draft.email} onChange={(e) => setDraft({ ...draft, email: e.currentTarget.value })} error={draftErrors.email} hint="Optional." autoComplete="off" />
            <TextField label="Phone" type="tel" value={draft.phone} onChange={(e) => setDraft({ ...draft, phone: e.currentTarget.value })} error={draftErrors.phone} hint="Optional." autoComplete="off" />
          </div>
          <div className="flex gap-2">
            <Button type="button" size="sm" onClick={add} loading={create.isPending}>
              Add customer
            </Button>
            <Button type="button" variant="secondary" size="sm" onClick={() => setAdding(false)}>
              Cancel
            </Button>
          </div>
        </div>
      )}
    </fieldset>
  );
}
