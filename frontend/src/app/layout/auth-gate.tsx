import { useQuery } from '@tanstack/react-query';
import { isApiError } from '@/lib/api-client';
import { meQueryOptions } from '@/lib/auth';
import { AppShell } from '@/app/layout/app-shell';
import { FullPageLoading } from '@/app/layout/full-page-loading';
import { SignInPage } from '@/app/routes/sign-in-page';

/** Loads who is signed in; shows the sign-in page to a visitor and the app to a signed-in person. */
export function AuthGate() {
  const me = useQuery(meQueryOptions());
  if (isApiError(me.error) && me.error.code === 'unauthenticated') return <SignInPage />;
  if (me.data) return <AppShell me={me.data} />;
  if (me.error) throw me.error;
  return <FullPageLoading />;
}
