import type { ReactNode } from 'react';
import { ProductName, SkipLink } from '@/app/layout/app-shell';

/** A page outside the app shell (sign in, signed out, fatal errors): the name and one card. */
export function PlainPage({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <SkipLink />
      <header className="on-dark bg-iron-900 px-4 py-2.5 text-paper-50 sm:px-6">
        <ProductName />
      </header>
      <div className="h-1 bg-sepia-700" aria-hidden="true" />
      <main id="main" tabIndex={-1} className="flex flex-1 items-start justify-center px-4 py-12 outline-none">
        <div className="w-full max-w-lg rounded border border-paper-300 bg-white p-6 shadow-sm sm:p-8">{children}</div>
      </main>
    </div>
  );
}
