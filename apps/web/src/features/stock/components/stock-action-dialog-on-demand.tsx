import { useQueryClient } from '@tanstack/react-query';
import { lazy, Suspense, useEffect } from 'react';
import type { StockActionDialogProps } from './stock-action-dialog';

const StockActionDialog = lazy(() => import('./stock-action-dialog').then((m) => ({ default: m.StockActionDialog })));

/**
 * The stock action dialog, its code (forms, the bins list, the catalogue's number check) loaded
 * when it first opens: panels that only offer it, such as the part page's stock panel, start
 * without it (docs/decisions/027-part-page-first-load.md, "Later"). Closed, it renders nothing, as the
 * dialog itself does.
 */
export function StockActionDialogOnDemand(props: StockActionDialogProps) {
  const queryClient = useQueryClient();
  const { shopId, action } = props;
  // The bins list is asked for while the dialog's code loads, not after. Its module (with the bins
  // schema, and so zod) is itself loaded here, not with the panel (decision 029).
  useEffect(() => {
    if (action) void import('../api/get-bins').then((m) => queryClient.prefetchQuery(m.binsQueryOptions(shopId)), () => undefined);
  }, [action, queryClient, shopId]);
  if (!action) return null;
  return (
    <Suspense fallback={null}>
      <StockActionDialog {...props} />
    </Suspense>
  );
}
