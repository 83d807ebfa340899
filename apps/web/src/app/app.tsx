import { useState } from 'react';
import { RouterProvider } from 'react-router-dom';
import { createQueryClient } from '../lib/query-client';
import { AppProvider } from './provider';
import { createAppRouter } from './router';

/** The whole app: one QueryClient and one router for the page's lifetime. */
export function App() {
  const [queryClient] = useState(createQueryClient);
  const [router] = useState(() => createAppRouter(queryClient));
  return (
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>
  );
}
