import type { ReactNode } from 'react';

export function PageHeader({ title, description, actions }: { title: string; description?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-5 flex flex-wrap items-end justify-between gap-3 border-b border-paper-300 pb-4">
      <div className="min-w-0">
        <h1 className="text-2xl sm:text-[1.75rem]">{title}</h1>
        {description ? <p className="mt-1 max-w-3xl text-sm text-ink-700">{description}</p> : null}
      </div>
      {actions ? <div className="flex items-center gap-2">{actions}</div> : null}
    </div>
  );
}
