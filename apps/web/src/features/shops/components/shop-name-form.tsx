import { Button, FormMessage, TextField, useToast } from '@tappet/ui';
import { useRef, type FormEvent } from 'react';
import { formValues, useFormErrors } from '../../../lib/forms';
import { updateShopSchema, useUpdateShop } from '../api/update-shop';

/** Renames the shop (owners). The field starts with the current name. */
export function ShopNameForm({ shopId, currentName }: { shopId: string; currentName: string }) {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const update = useUpdateShop(shopId);
  const toast = useToast();

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const parsed = updateShopSchema.safeParse(formValues(event.currentTarget));
    if (!parsed.success) {
      errors.failValidation(parsed.error);
      return;
    }
    errors.clear();
    if (parsed.data.name === currentName) {
      toast.show('The name is unchanged.', 'info');
      return;
    }
    update.mutate(parsed.data, {
      onSuccess: (shop) => toast.show(`Shop renamed to ${shop.name}.`, 'ok'),
      onError: (error) => errors.failApi(error, ['name']),
    });
  }

  return (
    <form ref={formRef} noValidate onSubmit={onSubmit} className="flex max-w-xl flex-col gap-4">
      {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
      <TextField
        // A new key after each save resets the field to the saved name.
        key={currentName}
        label="Shop name"
        name="name"
        defaultValue={currentName}
        autoComplete="organization"
        hint="Shown to everyone in the shop, in the shop switcher and on documents."
        error={errors.fieldErrors.name}
      />
      <div>
        <Button type="submit" loading={update.isPending}>
          Save shop name
        </Button>
      </div>
    </form>
  );
}
