import { z } from 'zod';

/** A record id (UUID). */
export const id = z.string().uuid({ message: 'Not a record id' });
/** `:id` in a path. */
export const idParamsSchema = z.object({ id });
/**
 * A calendar date that exists, as YYYY-MM-DD: 2024-02-31 is refused, with one message, worded by
 * the product's error map ("Enter a real date, as YYYY-MM-DD").
 */
export const isoDate = z.iso.date();
/** `?version=N` on a delete: the version the user saw. */
export const versionQuerySchema = z.object({ version: z.coerce.number().int().min(1) });
/** `{ version }`: the version the user saw, for an action on a record. */
export const versionBodySchema = z.object({ version: z.number().int().min(1) });
/** A POST that carries nothing. */
export const emptyBodySchema = z.object({}).optional();
/** `{ id }` answered by a delete. */
export const deletedSchema = z.object({ id: z.string() });
