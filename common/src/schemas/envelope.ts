import { z } from 'zod';
// The product's words for zod's default messages, installed for every schema on both sides.
import './messages';

export const ERROR_CODES = [
  'validation_failed', 'unauthenticated', 'forbidden', 'not_found', 'conflict',
  // 422: the request cannot be applied as sent (an Idempotency-Key reused for a different request).
  'unprocessable',
  'payload_too_large', 'unsupported_media_type', 'service_unavailable', 'internal_error',
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number];

export const fieldIssueSchema = z.object({
  path: z.string().describe('Dotted path of the offending field, "" for the whole input'),
  message: z.string(),
  code: z.string(),
});
export type FieldIssue = z.infer<typeof fieldIssueSchema>;

export const errorEnvelopeSchema = z.object({
  error: z.object({
    code: z.enum(ERROR_CODES),
    message: z.string(),
    status: z.number().int(),
    requestId: z.string(),
    details: z.unknown().optional(),
  }),
});
export type ErrorEnvelope = z.infer<typeof errorEnvelopeSchema>;

export const paginationSchema = z.object({
  page: z.number().int().min(1),
  pageSize: z.number().int().min(1),
  total: z.number().int().min(0),
  /** True when `total` is the database's estimate: large results are counted exactly only up to a cap. */
  estimated: z.boolean().optional(),
});
export type Pagination = z.infer<typeof paginationSchema>;

export const pageQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});

export function dataEnvelope<T extends z.ZodType>(data: T) {
  return z.object({ data });
}

export function pageEnvelope<T extends z.ZodType>(item: T) {
  return z.object({ data: z.array(item), pagination: paginationSchema });
}
