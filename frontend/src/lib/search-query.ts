import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { z } from 'zod';

type Plain = Record<string, string | number | boolean | undefined>;

/**
 * Reads a list query from URL search params through the API's own zod schema. Values the
 * schema rejects are dropped one by one (so `?role=wizard&page=2` still keeps page 2).
 */
export function parseSearchQuery<T extends Plain>(schema: z.ZodType<T>, params: URLSearchParams): T {
  const raw: Record<string, string> = Object.fromEntries(params.entries());
  for (let attempt = 0; attempt <= Object.keys(raw).length; attempt += 1) {
    const result = schema.safeParse(raw);
    if (result.success) return result.data;
    const bad = new Set(result.error.issues.map((issue) => String(issue.path[0] ?? '')));
    let removed = false;
    for (const key of bad) {
      if (key in raw) {
        delete raw[key];
        removed = true;
      }
    }
    if (!removed) break;
  }
  return schema.parse({});
}

/** Writes a list query back to search params, leaving out defaults and empty values. */
export function writeSearchQuery<T extends Plain>(
  query: T,
  defaults: Partial<T>,
  keep?: URLSearchParams,
): URLSearchParams {
  const next = new URLSearchParams();
  if (keep) {
    for (const [key, value] of keep.entries()) if (!(key in defaults) && !(key in query)) next.set(key, value);
  }
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === '' || value === defaults[key]) continue;
    next.set(key, String(value));
  }
  return next;
}

/**
 * The URL is the single source of a list's state: the object returned here is exactly what
 * the API receives and what the table shows. Changing anything but the page goes back to page 1.
 */
export function useSearchQuery<T extends Plain>(schema: z.ZodType<T>) {
  const [params, setParams] = useSearchParams();
  const query = useMemo(() => parseSearchQuery(schema, params), [schema, params]);
  const defaults = useMemo(() => schema.parse({}), [schema]);

  const setQuery = useCallback(
    (patch: Partial<T>) => {
      const changesFilter = Object.keys(patch).some((key) => key !== 'page');
      const next = { ...query, ...patch } as T;
      if (changesFilter && !('page' in patch) && 'page' in next) (next as Plain).page = 1;
      setParams(writeSearchQuery(next, defaults, params));
    },
    [query, defaults, params, setParams],
  );

  return [query, setQuery] as const;
}
