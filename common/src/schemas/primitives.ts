import { z } from 'zod';

/** A record id (UUID). */
export const id = z.string().uuid({ message: 'Not a record id' });
/** `:id` in a path. */
export const idParamsSchema = z.object({ id });
function isRealDate(text: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const date = new Date(Date.UTC(y, mo - 1, d));
  return date.getUTCFullYear() === y && date.getUTCMonth() === mo - 1 && date.getUTCDate() === d;
}
/** A calendar date that exists, as YYYY-MM-DD (2024-02-31 is refused, with one message). */
export const isoDate = z.string().refine(isRealDate, 'A date as YYYY-MM-DD');
/** `?version=N` on a delete: the version the user saw. */
export const versionQuerySchema = z.object({ version: z.coerce.number().int().min(1) });
/** `{ version }`: the version the user saw, for an action on a record. */
export const versionBodySchema = z.object({ version: z.number().int().min(1) });
/** A POST that carries nothing. */
export const emptyBodySchema = z.object({}).optional();
/** `{ id }` answered by a delete. */
export const deletedSchema = z.object({ id: z.string() });
