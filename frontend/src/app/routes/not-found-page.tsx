import { Link } from 'react-router-dom';
import { useDocumentTitle } from '@/lib/use-document-title';

export function NotFoundPage() {
  useDocumentTitle('Page not found');
  return (
    <section className="max-w-2xl">
      <h1 className="text-2xl">Page not found</h1>
      <p className="mt-3 text-ink-700">There is no page at this address. It may have moved, or the link may be mistyped.</p>
      <p className="mt-4">
        <Link to="/">Go to the overview</Link>
      </p>
    </section>
  );
}
