import { Brand } from '../../components/brand';
import { NotFoundContent } from '../../components/errors/not-found';
import { useDocumentTitle } from '../../lib/use-document-title';

/** The 404 page for any address the app does not know. */
export default function NotFoundRoute() {
  useDocumentTitle('Not found');
  return (
    <div className="flex min-h-screen flex-col">
      <header className="px-6 py-4">
        <Brand />
      </header>
      <main id="main" className="mx-auto w-full max-w-3xl flex-1 px-4 py-8">
        <NotFoundContent />
      </main>
    </div>
  );
}
