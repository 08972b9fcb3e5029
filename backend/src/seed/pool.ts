/**
 * Runs `fn` over `items`, `width` at a time. With a signal, no item starts after it is aborted,
 * and the pool returns (rejecting with the abort reason) only once every running item has
 * finished: nothing of the seed still touches the database when the caller closes it.
 */
export async function inPool<T>(items: T[], width: number, fn: (item: T) => Promise<void>, signal?: AbortSignal): Promise<void> {
  let next = 0;
  const results = await Promise.allSettled(
    Array.from({ length: Math.max(1, width) }, async () => {
      while (next < items.length) {
        signal?.throwIfAborted();
        await fn(items[next++]);
      }
    }),
  );
  signal?.throwIfAborted();
  const failed = results.find((r): r is PromiseRejectedResult => r.status === 'rejected');
  if (failed) throw failed.reason;
}

/** Whether an error is the seed stopping because its signal was aborted. */
export function isAbort(err: unknown): boolean {
  return err instanceof Error && (err.name === 'AbortError' || err.name === 'TimeoutError');
}
