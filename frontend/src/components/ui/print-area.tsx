import type { ReactNode } from 'react';

/**
 * Content meant to be printed on its own. While it is on the page, printing leaves out the app's
 * header and side navigation; mark screen-only controls inside it with `print:hidden`.
 */
export function PrintArea({ children, className = '' }: { children: ReactNode; className?: string }) {
  return (
    <div
      data-print-area=""
      className={`print:[body:has(&)_aside]:hidden print:[body:has(&)_header]:hidden print:[body:has(&)_main]:p-0 ${className}`}
    >
      {children}
    </div>
  );
}
