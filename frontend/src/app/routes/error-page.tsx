import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { isApiError } from '@/lib/api-client';
import { buttonClasses } from '@/components/ui/button';
import { NotFoundPage } from '@/app/routes/not-found-page';
import { useDocumentTitle } from '@/lib/use-document-title';

function describe(error: unknown): string {
  if (isRouteErrorResponse(error)) return `${error.status} ${error.statusText}`.trim();
  if (error instanceof Error) return error.message;
  return 'An unexpected error happened.';
}

/** What a route shows when it fails: the message, and the request id when the server sent one. */
export function ErrorPage() {
  const error = useRouteError();
  useDocumentTitle('Something went wrong');
  if ((isRouteErrorResponse(error) && error.status === 404) || (isApiError(error) && error.code === 'not_found')) {
    return <NotFoundPage />;
  }
  return (
    <section role="alert" className="max-w-2xl p-4 sm:p-6">
      <h1 className="text-2xl">Something went wrong</h1>
      <p className="mt-3 text-ink-800">{describe(error)}</p>
      {isApiError(error) && error.requestId ? (
        <p className="mt-2 text-sm text-ink-700">
          Request id <code className="mono select-all">{error.requestId}</code> — quote it when you report the problem.
        </p>
      ) : null}
      <div className="mt-5 flex gap-3">
        <button type="button" className={buttonClasses('primary')} onClick={() => window.location.reload()}>
          Try again
        </button>
        <Link to="/" className={buttonClasses('secondary', 'md', 'no-underline')}>
          Go to the overview
        </Link>
      </div>
    </section>
  );
}
