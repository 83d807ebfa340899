import type { QueryClient } from '@tanstack/react-query';
import { RouterProvider } from 'react-router-dom';
import { AppProvider } from './provider';
import type { createAppRouter } from './router';

/** The whole app: one QueryClient and one router for the page's lifetime (made in main.tsx). */
export function App({ queryClient, router }: { queryClient: QueryClient; router: ReturnType<typeof createAppRouter> }) {
  return (
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>
  );
}
