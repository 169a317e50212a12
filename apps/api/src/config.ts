import { tmpdir } from 'node:os';
import { z } from 'zod';

const REQUIRED_SECRET = 'is required (the local scripts export it from .data/secrets.env)';
const bool = z.enum(['true', 'false', '1', '0']).transform((v) => v === 'true' || v === '1');

/**
 * Every setting the API reads, with safe local defaults. Secrets have no default: the local scripts
 * generate them into .data/secrets.env and export them.
 */
const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number({ error: 'must be a port number' }).int().min(1).max(65535).default(4300),
  /** Default: the API's own address on PORT, so links in e-mails and reports reach this instance. */
  PUBLIC_BASE_URL: z.url().optional(),
  /**
   * Which hops may set X-Forwarded-For (Express's "trust proxy"): off by default, so no caller can
   * pick the address that rate limits count. `loopback`, a hop count like `1`, or addresses/CIDRs.
   */
  TRUST_PROXY: z
    .string()
    .trim()
    .regex(/^(false|true|\d+|[0-9a-fA-F:./, ]+|loopback|linklocal|uniquelocal)$/, 'false, a hop count, loopback, or addresses/CIDRs separated by commas')
    .default('false'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  BODY_LIMIT: z.string().regex(/^\d+(b|kb|mb)$/i, 'like 256kb or 2mb').default('256kb'),
  DATABASE_HOST: z.string().default('127.0.0.1'),
  DATABASE_PORT: z.coerce.number().int().default(54329),
  DATABASE_USER: z.string().default('ohmprint'),
  DATABASE_PASSWORD: z.string({ error: REQUIRED_SECRET }).min(1, REQUIRED_SECRET),
  DATABASE_NAME: z.string().default('ohmprint'),
  DATABASE_POOL_SIZE: z.coerce.number().int().min(1).max(100).default(10),
  JWT_ACCESS_SECRET: z.string({ error: REQUIRED_SECRET }).min(32, 'must be at least 32 characters'),
  ACCESS_TOKEN_TTL_SECONDS: z.coerce.number().int().min(30).max(86400).default(900),
  REFRESH_TOKEN_TTL_DAYS: z.coerce.number().int().min(1).max(90).default(14),
  REFRESH_REUSE_GRACE_SECONDS: z.coerce.number().int().min(0).max(60).default(10),
  COOKIE_SECURE: bool.optional(),
  BCRYPT_COST: z.coerce.number().int().min(4).max(15).default(12),
  SIGN_IN_MAX_FAILURES: z.coerce.number().int().min(1).default(10),
  SIGN_IN_WINDOW_MINUTES: z.coerce.number().int().min(1).default(15),
  SIGN_IN_MAX_FAILURES_PER_ADDRESS: z.coerce.number().int().min(1).default(30),
  SIGN_IN_MAX_FAILURES_PER_ACCOUNT: z.coerce.number().int().min(1).default(50),
  SIGN_IN_GLOBAL_PER_MINUTE: z.coerce.number().int().min(1).default(600),
  PASSWORD_RESET_TTL_MINUTES: z.coerce.number().int().min(5).max(1440).default(60),
  INVITATION_TTL_DAYS: z.coerce.number().int().min(1).max(60).default(14),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(1025),
  SMTP_SECURE: bool.default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().default('Ohmprint <no-reply@ohmprint.test>'),
  OUTBOX_POLL_MS: z.coerce.number().int().min(100).default(2000),
  OUTBOX_MAX_ATTEMPTS: z.coerce.number().int().min(1).default(12),
  OUTBOX_WORKER: bool.default(true),
  // Empty (STRIPE_API_BASE=) means the hosted payment service; the default is the local payment service.
  STRIPE_API_BASE: z.union([z.literal(''), z.url()]).default('http://127.0.0.1:12111'),
  STRIPE_SECRET_KEY: z.string().min(1).default('sk_test_ohmprint_local'),
  PAYMENT_WEBHOOK_SECRET: z.string().optional(),
  CPU_WORKERS: z.coerce.number().int().min(1).max(64).optional(),
  /** Decoded published libraries kept in memory, in megabytes (estimated), least recently used out first. */
  LIBRARY_CACHE_MAX_MB: z.coerce.number().int().min(1).max(65536).default(192),
  UPLOAD_TMP_DIR: z.string().min(1).optional(),
  /** A library version with more included lots than this is published by a worker (202 + status), not on the request. */
  LIBRARY_PUBLISH_JOB_LOTS: z.coerce.number().int().min(0).default(500),
  /** A running report issuance whose worker no longer holds its approval is handed on after this long. */
  ISSUANCE_STALLED_AFTER_SECONDS: z.coerce.number().int().min(1).max(3600).default(30),
  /** An analysis against a library version with more included lots than this runs on a worker (202 + status). */
  ANALYSIS_JOB_LOTS: z.coerce.number().int().min(0).default(20000),
  SHUTDOWN_TIMEOUT_MS: z.coerce.number().int().min(100).default(10000),
  OHMPRINT_DATA_DIR: z.string().default('.data'),
  PORTALS_DIR: z.string().default('dist'),
});

export type Env = z.infer<typeof EnvSchema>;

export function parseEnv(env: NodeJS.ProcessEnv): Env {
  const parsed = EnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration (environment variables):\n${lines.join('\n')}`);
  }
  return parsed.data;
}

/** Express's "trust proxy" value: false, a hop count, or the list of trusted addresses. */
export function trustProxySetting(value: string): boolean | number | string {
  if (value === 'false') return false;
  if (value === 'true') return true;
  if (/^\d+$/.test(value)) return Number(value);
  return value;
}

export function buildConfig(env: Env) {
  const production = env.NODE_ENV === 'production';
  return {
    env: env.NODE_ENV,
    production,
    host: env.HOST,
    port: env.PORT,
    publicBaseUrl: (env.PUBLIC_BASE_URL ?? `http://127.0.0.1:${env.PORT}`).replace(/\/+$/, ''),
    trustProxy: trustProxySetting(env.TRUST_PROXY),
    logLevel: env.NODE_ENV === 'test' && env.LOG_LEVEL === 'info' ? 'silent' : env.LOG_LEVEL,
    bodyLimit: env.BODY_LIMIT,
    database: {
      host: env.DATABASE_HOST,
      port: env.DATABASE_PORT,
      username: env.DATABASE_USER,
      password: env.DATABASE_PASSWORD,
      database: env.DATABASE_NAME,
      poolSize: env.DATABASE_POOL_SIZE,
    },
    auth: {
      accessSecret: env.JWT_ACCESS_SECRET,
      accessTtlSeconds: env.ACCESS_TOKEN_TTL_SECONDS,
      refreshTtlDays: env.REFRESH_TOKEN_TTL_DAYS,
      refreshReuseGraceSeconds: env.REFRESH_REUSE_GRACE_SECONDS,
      cookieSecure: env.COOKIE_SECURE ?? production,
      bcryptCost: env.BCRYPT_COST,
      signInMaxFailures: env.SIGN_IN_MAX_FAILURES,
      signInWindowMinutes: env.SIGN_IN_WINDOW_MINUTES,
      signInMaxFailuresPerAddress: env.SIGN_IN_MAX_FAILURES_PER_ADDRESS,
      signInMaxFailuresPerAccount: env.SIGN_IN_MAX_FAILURES_PER_ACCOUNT,
      signInGlobalPerMinute: env.SIGN_IN_GLOBAL_PER_MINUTE,
      passwordResetTtlMinutes: env.PASSWORD_RESET_TTL_MINUTES,
      invitationTtlDays: env.INVITATION_TTL_DAYS,
    },
    mail: {
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: env.SMTP_SECURE,
      user: env.SMTP_USER,
      password: env.SMTP_PASSWORD,
      from: env.MAIL_FROM,
      pollMs: env.OUTBOX_POLL_MS,
      maxAttempts: env.OUTBOX_MAX_ATTEMPTS,
      workerEnabled: env.OUTBOX_WORKER,
    },
    payments: {
      apiBase: env.STRIPE_API_BASE || undefined,
      secretKey: env.STRIPE_SECRET_KEY,
      webhookSecret: env.PAYMENT_WEBHOOK_SECRET,
    },
    cpuWorkers: env.CPU_WORKERS,
    libraryCacheMaxBytes: env.LIBRARY_CACHE_MAX_MB * 1024 * 1024,
    /** Where uploads stream to, each in a private folder removed after its answer (default: the OS temp folder). */
    uploadTmpDir: env.UPLOAD_TMP_DIR ?? tmpdir(),
    jobs: { libraryPublishLots: env.LIBRARY_PUBLISH_JOB_LOTS, analysisLots: env.ANALYSIS_JOB_LOTS, issuanceStalledAfterSeconds: env.ISSUANCE_STALLED_AFTER_SECONDS },
    shutdownTimeoutMs: env.SHUTDOWN_TIMEOUT_MS,
    dataDir: env.OHMPRINT_DATA_DIR,
    portalsDir: env.PORTALS_DIR,
  };
}

export type Config = ReturnType<typeof buildConfig>;

/** Parsed once at start; the process fails fast with every invalid variable listed. */
export const config: Config = buildConfig(parseEnv(process.env));
