export function FullPageLoading() {
  return (
    <div className="flex min-h-screen items-center justify-center">
      <p role="status" className="flex items-center gap-2 text-sm text-ink-700">
        <span aria-hidden="true" className="inline-block size-3 animate-pulse rounded-full bg-iron-600" />
        Loading Toneledger…
      </p>
    </div>
  );
}
