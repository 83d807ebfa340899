import { ErrorState, LoadingState } from '@tappet/ui';
import { isRouteErrorResponse, Outlet, ScrollRestoration, useRouteError } from 'react-router-dom';
import { Brand } from '../../components/brand';
import { NotFoundContent } from '../../components/errors/not-found';

export function RootLayout() {
  return (
    <>
      <Outlet />
      <ScrollRestoration />
    </>
  );
}

/** Shown while the first screen's code and data load. */
export function RootFallback() {
  return (
    <main className="flex min-h-screen items-center justify-center">
      <LoadingState label="Loading Tappet…" />
    </main>
  );
}

function isChunkLoadError(error: unknown): boolean {
  return error instanceof Error && /dynamically imported module|Importing a module script failed|Failed to fetch/i.test(error.message);
}

/** Last line of defence: a readable page for anything no inner route handled. */
export function RootErrorBoundary() {
  const error = useRouteError();
  const notFound = isRouteErrorResponse(error) && error.status === 404;
  return (
    <div className="flex min-h-screen flex-col">
      <header className="px-6 py-4">
        <Brand />
      </header>
      <main id="main" className="mx-auto w-full max-w-3xl flex-1 px-4 py-8">
        {notFound ? (
          <NotFoundContent />
        ) : (
          <>
            <h1 className="mb-4 text-xl font-bold">Tappet could not show this page</h1>
            <ErrorState
              title={isChunkLoadError(error) ? 'Tappet was updated' : 'Something went wrong'}
              message={
                isChunkLoadError(error)
                  ? 'A newer version is available. Reload the page to continue.'
                  : 'An unexpected error stopped this page. Reload to try again; if it keeps happening, tell your shop’s owner.'
              }
              onRetry={() => window.location.reload()}
            />
          </>
        )}
      </main>
    </div>
  );
}
