import { useEffect, useRef } from 'react';
import { Link, Outlet, useLocation, useNavigation } from 'react-router-dom';
import type { Me } from '@toneledger/common/schemas/users';
import { MainNav } from '@/app/layout/main-nav';
import { UserBlock } from '@/app/layout/user-block';

export function SkipLink() {
  return (
    <a
      href="#main"
      className="sr-only z-50 rounded border border-iron-800 bg-paper-50 px-3 py-2 font-medium text-iron-900 shadow-lg focus:not-sr-only focus:fixed focus:top-2 focus:left-2"
    >
      Skip to content
    </a>
  );
}

export function ProductName({ className = '' }: { className?: string }) {
  return <span className={`font-serif text-xl font-semibold tracking-tight ${className}`}>Toneledger</span>;
}

function EnvironmentTag({ environment }: { environment: Me['environment'] }) {
  if (environment === 'production') return null;
  return (
    <span className="rounded bg-sepia-100 px-1.5 py-0.5 text-[0.6875rem] font-semibold tracking-wide text-sepia-800 uppercase">
      {environment}
    </span>
  );
}

/** Header, main navigation and the page. Focus moves to the page when the path changes. */
export function AppShell({ me }: { me: Me }) {
  const { pathname } = useLocation();
  const navigation = useNavigation();
  const mainRef = useRef<HTMLElement>(null);
  const firstPath = useRef(pathname);

  useEffect(() => {
    if (pathname === firstPath.current) return;
    firstPath.current = pathname;
    mainRef.current?.focus();
  }, [pathname]);

  return (
    <div className="flex min-h-screen flex-col">
      <SkipLink />
      <header className="on-dark bg-iron-900 text-paper-50 print:hidden">
        <div className="flex flex-wrap items-center justify-between gap-3 px-4 py-2.5 sm:px-6">
          <div className="flex items-center gap-3">
            <Link to="/" className="text-paper-50 no-underline hover:text-white">
              <ProductName />
            </Link>
            <EnvironmentTag environment={me.environment} />
          </div>
          <UserBlock me={me} />
        </div>
        <div className="h-1 bg-sepia-700" aria-hidden="true">
          {navigation.state === 'loading' ? <div className="h-1 w-1/3 animate-pulse bg-sepia-200" /> : null}
        </div>
      </header>
      <div className="flex flex-1 flex-col md:flex-row">
        <aside className="border-b border-paper-300 bg-paper-100 px-3 py-4 md:w-56 md:shrink-0 md:border-r md:border-b-0 print:hidden">
          <MainNav me={me} />
        </aside>
        <main id="main" ref={mainRef} tabIndex={-1} className="min-w-0 flex-1 px-4 py-5 outline-none sm:px-6 lg:px-8 print:p-0">
          {navigation.state === 'loading' ? (
            <p role="status" className="sr-only">
              Loading page…
            </p>
          ) : null}
          <Outlet />
        </main>
      </div>
    </div>
  );
}
