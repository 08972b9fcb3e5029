import { Link } from 'react-router-dom';
import { useDocumentTitle } from '@/lib/use-document-title';

export function NotAllowedPage({ what }: { what: string }) {
  useDocumentTitle('Not allowed');
  return (
    <section className="max-w-2xl">
      <h1 className="text-2xl">Not allowed</h1>
      <p className="mt-3 text-ink-700">
        {what} is not open to your role. If your work needs it, ask an administrator to change your role.
      </p>
      <p className="mt-4">
        <Link to="/">Go to the overview</Link>
      </p>
    </section>
  );
}
