import { z } from 'zod';

const bool = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'])
  .transform((v) => v === 'true' || v === '1' || v === 'yes');
const list = z
  .string()
  .default('')
  .transform((s) => s.split(',').map((x) => x.trim()).filter(Boolean));

const envSchema = z
  .object({
    NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
    HOST: z.string().default('127.0.0.1'),
    PORT: z.coerce.number().int().min(0).max(65535).default(4010),
    PUBLIC_URL: z.string().url().default('http://localhost:4010'),
    ALLOWED_ORIGINS: list,
    TRUST_PROXY: z.string().default('loopback'),
    LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
    STATIC_DIR: z.string().optional(),

    DATABASE_URL: z.string().min(1, 'DATABASE_URL is required'),
    // Two at least: migrations run on one connection while another holds their advisory lock.
    DATABASE_POOL_MAX: z.coerce.number().int().min(2, 'DATABASE_POOL_MAX must be at least 2').default(10),

    S3_ENDPOINT: z.string().url().optional(),
    S3_REGION: z.string().default('us-east-1'),
    S3_BUCKET: z.string().min(3, 'S3_BUCKET needs at least 3 characters'),
    S3_ACCESS_KEY_ID: z.string().min(1),
    S3_SECRET_ACCESS_KEY: z.string().min(1),
    S3_FORCE_PATH_STYLE: bool.default(true),

    OIDC_ISSUER: z.string().url(),
    OIDC_CLIENT_ID: z.string().min(1),
    OIDC_CLIENT_SECRET: z.string().optional(),
    OIDC_SCOPES: z.string().default('openid email profile'),
    OIDC_ALLOW_INSECURE: bool.default(false),

    SMTP_URL: z.string().min(1),
    MAIL_FROM: z.string().default('Toneledger <no-reply@toneledger.invalid>'),
    MAIL_SINK_API: z.string().url().optional(),

    SESSION_SECRET: z.string().min(16, 'SESSION_SECRET must be at least 16 characters'),
    SESSION_IDLE_MINUTES: z.coerce.number().int().min(1).default(120),
    SESSION_ABSOLUTE_HOURS: z.coerce.number().int().min(1).default(12),

    IMAGE_MAX_MB: z.coerce.number().positive().default(300),
    IMAGE_RETENTION_DAYS: z.coerce.number().int().min(1).default(90),
    /** When the nightly fixity sweep runs (cron, five fields, UTC). */
    TONELEDGER_FIXITY_CRON: z.string().trim().regex(/^\S+(\s+\S+){4}$/, 'a cron expression of five fields, e.g. "30 2 * * *"').default('30 2 * * *'),

    ADMIN_EMAILS: list,
    DEFAULT_ROLE: z.enum(['viewer', 'researcher']).default('viewer'),
  })
  .superRefine((e, ctx) => {
    if (e.NODE_ENV === 'production') {
      if (e.OIDC_ALLOW_INSECURE) ctx.addIssue({ code: 'custom', path: ['OIDC_ALLOW_INSECURE'], message: 'not allowed in production' });
      if (e.MAIL_SINK_API) ctx.addIssue({ code: 'custom', path: ['MAIL_SINK_API'], message: 'the mail sink is for development only' });
      if (!e.PUBLIC_URL.startsWith('https://')) ctx.addIssue({ code: 'custom', path: ['PUBLIC_URL'], message: 'must be https in production' });
    }
  });

export type Env = z.infer<typeof envSchema>;

export function parseEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const result = envSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join('.') || '(env)'}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  return result.data;
}

let cached: Env | undefined;
/** The environment, read and validated once. */
export function env(): Env {
  cached ??= parseEnv();
  return cached;
}
