import { Link } from 'react-router-dom';
import { ErrorNotice } from '@/components/ui/notice';
import { isApiError } from '@/lib/api-client';

/** What a condition page shows when its print or report could not be loaded. */
export function NotLoaded({ error, what }: { error: unknown; what: 'print' | 'report' }) {
  const missing = isApiError(error) && error.code === 'not_found';
  return (
    <section className="max-w-2xl">
      <h1 className="text-2xl">{missing ? `${what === 'print' ? 'Print' : 'Report'} not found` : `The ${what} could not be loaded`}</h1>
      <div className="mt-3">
        {missing ? <p className="text-ink-700">There is no {what} with this address. It may have been deleted or discarded.</p> : <ErrorNotice error={error} />}
      </div>
      <p className="mt-4">
        <Link to="/condition">Back to Condition</Link>
      </p>
    </section>
  );
}
