import { render } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { AppProvider } from '../app/provider';
import { createAppRouter } from '../app/router';
import { createQueryClient } from '../lib/query-client';

/** Renders the real route table in memory at `path`, with a fresh query cache. */
export function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createAppRouter(queryClient, (routes) => createMemoryRouter(routes, { initialEntries: [path] }));
  const utils = render(
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...utils, router, queryClient };
}
