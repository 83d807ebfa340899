import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { ToastProvider } from '@tappet/ui';
import type { ReactNode } from 'react';

/** Everything the screens expect above them: the query cache and the toasts. */
export function AppProvider({ queryClient, children }: { queryClient: QueryClient; children: ReactNode }) {
  return (
    <QueryClientProvider client={queryClient}>
      <ToastProvider>{children}</ToastProvider>
    </QueryClientProvider>
  );
}
