import { PlainPage } from '@/app/layout/plain-page';
import { buttonClasses } from '@/components/ui/button';
import { signInHref } from '@/lib/auth';
import { useDocumentTitle } from '@/lib/use-document-title';

export function SignedOutPage() {
  useDocumentTitle('Signed out');
  return (
    <PlainPage>
      <h1 className="text-2xl">You have signed out</h1>
      {new URLSearchParams(window.location.search).get('error') === 'deactivated' ? (
        <p role="alert" className="mt-3 text-danger-700">
          This account has been deactivated, so it cannot sign in. An administrator can reactivate it.
        </p>
      ) : null}
      <p className="mt-3 text-ink-700">Your session has ended. Close this window if you are on a shared computer.</p>
      <p className="mt-6">
        <a href={signInHref('/')} className={buttonClasses('secondary', 'md', 'no-underline')}>
          Sign in again
        </a>
      </p>
    </PlainPage>
  );
}
