import { applyStoredTheme } from '@tappet/ui';
import { startTransition, StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './app/app';
import { createAppRouter } from './app/router';
import { createQueryClient } from './lib/query-client';
import './styles.css';

applyStoredTheme();

const container = document.getElementById('root');
if (!container) throw new Error('The page has no #root element.');

// The first load on a slow phone is three pieces of main-thread work rather than one long task
// that would hold up taps (docs/decisions/027-part-page-first-load.md): this module, then the router
// (made in a task of its own; it starts the first screen's loaders and requests), then the first
// render, as a transition that React renders in short slices.
setTimeout(() => {
  const queryClient = createQueryClient();
  const router = createAppRouter(queryClient);
  setTimeout(() => {
    startTransition(() => {
      createRoot(container).render(
        <StrictMode>
          <App queryClient={queryClient} router={router} />
        </StrictMode>,
      );
    });
  });
});
