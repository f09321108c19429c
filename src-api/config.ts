import { z } from 'zod';

/** Environment, validated once at start. Every setting has a loopback-safe default. */
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_URL: z.string().default('postgres://postgres@127.0.0.1:55432/yokeline'),
  SESSION_SECRET: z.string().min(16).default('yokeline-local-session-secret-change-me'),
  SESSION_IDLE_HOURS: z.coerce.number().positive().default(8),
  COOKIE_SECURE: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  WEB_DIST: z.string().optional(),
  PUBLIC_URL: z.string().default('http://127.0.0.1:3000'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(2525),
  /** The capture server's listing; set only when mail goes to the local capture server. */
  MAIL_CAPTURE_URL: z.string().optional(),
  MAIL_FROM: z.string().default('Yokeline <no-reply@harrowgate.test>'),
  S3_ENDPOINT: z.string().default('http://127.0.0.1:4569'),
  S3_BUCKET: z.string().default('yokeline'),
  S3_REGION: z.string().default('us-east-1'),
  S3_ACCESS_KEY: z.string().default('S3RVER'),
  S3_SECRET_KEY: z.string().default('S3RVER'),
  LOGIN_MAX_FAILURES: z.coerce.number().int().positive().default(10),
  LOGIN_WINDOW_MINUTES: z.coerce.number().positive().default(15),
  LOGIN_LOCK_MINUTES: z.coerce.number().positive().default(15),
  LOGIN_RATE_PER_MINUTE: z.coerce.number().int().positive().default(30),
  UPLOAD_RATE_PER_MINUTE: z.coerce.number().int().positive().default(120),
  WORKERS: z
    .enum(['true', 'false'])
    .default('true')
    .transform((v) => v === 'true'),
  /** Corrective-action response times (common practice: containment 24 h, root cause 10 working days, closure 30–60 days). */
  SCAR_CONTAINMENT_WORKING_DAYS: z.coerce.number().int().min(0).max(30).default(1),
  SCAR_ROOT_CAUSE_WORKING_DAYS: z.coerce.number().int().min(1).max(60).default(10),
  SCAR_CLOSURE_DAYS: z.coerce.number().int().min(1).max(365).default(45),
  /** Lots of the supplier × part that must pass without the defect before a SCAR may close. */
  SCAR_VERIFY_LOTS: z.coerce.number().int().min(1).max(50).default(3),
  /** Use as is needs a second engineer's signature beside the first. */
  USE_AS_IS_COUNTERSIGN: z
    .enum(['true', 'false'])
    .default('true')
    .transform((v) => v === 'true'),
  /** Outbox delivery: attempts before a mail is marked failed, and the first retry delay. */
  MAIL_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(50).default(8),
  MAIL_RETRY_BASE_SECONDS: z.coerce.number().min(1).max(3600).default(30),
});

export type AppConfig = z.infer<typeof envSchema>;

export function loadConfig(env: Record<string, string | undefined> = process.env, overrides: Partial<AppConfig> = {}): AppConfig {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
    throw new Error(`Invalid environment: ${lines}`);
  }
  return { ...parsed.data, ...overrides };
}

export const CONFIG = Symbol('CONFIG');
