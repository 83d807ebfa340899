import { buttonClasses } from '@tappet/ui';
import { Link } from 'react-router-dom';

/** "Not found" content: what happened and the way back. Used by the 404 page and inside the shell. */
export function NotFoundContent({ what = 'page' }: { what?: string }) {
  return (
    <div className="flex max-w-prose flex-col items-start gap-4">
      <h1 className="text-xl font-bold">This {what} was not found</h1>
      <p>The address may be mistyped, or it points to something that was removed or that you have no access to.</p>
      <Link to="/" className={buttonClasses('primary')}>
        Go to your home page
      </Link>
    </div>
  );
}
