import { z } from 'zod';

export const dependencyStatusSchema = z.object({
  ok: z.boolean(),
  latencyMs: z.number().nullable(),
  error: z.string().optional(),
});

export const healthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  version: z.string(),
  checks: z.object({ database: dependencyStatusSchema, storage: dependencyStatusSchema }),
});
export type Health = z.infer<typeof healthSchema>;

export const capturedMailSchema = z.object({
  id: z.string(),
  receivedAt: z.string().datetime(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  html: z.string().nullable(),
});
export type CapturedMail = z.infer<typeof capturedMailSchema>;

export const testMailSchema = z.object({
  to: z.string().email({ message: 'Enter an e-mail address' }).optional(),
});
