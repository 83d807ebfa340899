import { PublicApproval } from '../../features/estimates/components/public-approval';
import { useDocumentTitle } from '../../lib/use-document-title';

/**
 * /estimate-approval#<token>: where a customer answers an e-mailed estimate. No app chrome and no
 * account; the token stays in the fragment, which browsers never send to a server.
 */
export default function EstimateApprovalRoute() {
  useDocumentTitle('Your estimate');
  const token = typeof window === 'undefined' ? null : window.location.hash.replace(/^#/, '') || null;
  return (
    <main id="main" className="mx-auto w-full max-w-xl px-4 py-6 sm:py-10">
      <PublicApproval token={token} />
    </main>
  );
}
