import { Link } from 'react-router-dom';
import { useDocumentTitle } from '../../lib/use-document-title';

export function NotFoundPage() {
  useDocumentTitle('Page not found');
  return (
    <div className="max-w-prose">
      <h1 className="text-2xl font-bold">Page not found</h1>
      <p className="mt-2 text-sm text-ink-2">There is no page at this address. It may have moved, or the link may be incomplete.</p>
      <p className="mt-4">
        <Link to="/">Go to your home page</Link>
      </p>
    </div>
  );
}
