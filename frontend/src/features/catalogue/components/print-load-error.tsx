import { Link } from 'react-router-dom';
import { ErrorNotice } from '@/components/ui/notice';

/** What an editing page of a print shows when the print cannot be loaded. */
export function PrintLoadError({ error }: { error: unknown }) {
  return (
    <section className="max-w-2xl">
      <ErrorNotice error={error} title="The print could not be loaded." />
      <p className="mt-4">
        <Link to="/catalogue">Back to the prints</Link>
      </p>
    </section>
  );
}
