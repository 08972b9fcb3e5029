import type { ReactNode } from 'react';
import { isApiError } from '@/lib/api-client';

type Tone = 'info' | 'warning' | 'error' | 'success';

const TONES: Record<Tone, string> = {
  info: 'border-iron-200 bg-iron-50 text-iron-900',
  warning: 'border-sepia-200 bg-sepia-50 text-sepia-800',
  error: 'border-danger-200 bg-danger-50 text-danger-700',
  success: 'border-ok-200 bg-ok-50 text-ok-700',
};

export function Notice({ tone = 'info', title, children, role }: { tone?: Tone; title?: string; children?: ReactNode; role?: 'alert' | 'status' }) {
  return (
    <div role={role} className={`rounded border px-3 py-2 text-sm ${TONES[tone]}`}>
      {title ? <p className="font-semibold">{title}</p> : null}
      {children}
    </div>
  );
}

/** The message of a failed request, with the request id a support person can look up. */
export function ErrorNotice({ error, title }: { error: unknown; title?: string }) {
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <Notice tone="error" role="alert" title={title}>
      <p>{message}</p>
      {isApiError(error) && error.requestId ? (
        <p className="mt-1 text-xs">
          Request id <code className="mono select-all">{error.requestId}</code>
        </p>
      ) : null}
    </Notice>
  );
}
