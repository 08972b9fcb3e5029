export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" className="flex items-center gap-2 py-6 text-sm text-ink-700">
      <span aria-hidden="true" className="inline-block size-3 animate-pulse rounded-full bg-iron-600" />
      {label}
    </p>
  );
}
