import { useLocation } from 'react-router-dom';
import { authApi } from '@toneledger/common/api/auth';
import { PlainPage } from '@/app/layout/plain-page';
import { buttonClasses } from '@/components/ui/button';
import { urlOf } from '@/lib/api-client';
import { useDocumentTitle } from '@/lib/use-document-title';

/**
 * Shown to a visitor who is not signed in, at whatever address they asked for. The button
 * is a plain GET form, so sign-in is an ordinary browser navigation that comes back here.
 */
export function SignInPage() {
  useDocumentTitle('Sign in');
  const location = useLocation();
  const returnTo = `${location.pathname}${location.search}`;
  return (
    <PlainPage>
      <h1 className="text-2xl">Sign in to Toneledger</h1>
      <p className="mt-3 text-ink-700">
        Toneledger holds the records of a collection of toned silver prints: how each print was made, where it is
        kept, and how its condition and colour change over the years. Sign in with your institution account to
        continue.
      </p>
      <form method="get" action={urlOf(authApi.login)} className="mt-6">
        <input type="hidden" name="returnTo" value={returnTo} />
        <button type="submit" className={buttonClasses('primary', 'md', 'px-6')}>
          Sign in
        </button>
      </form>
    </PlainPage>
  );
}
