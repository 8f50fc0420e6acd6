import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';

const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');

const booleanFromEnv = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'])
  .transform((v) => v === 'true' || v === '1' || v === 'yes');

/**
 * Every setting, its environment variable and its default. Checked once at start; a bad value stops the
 * start with a message naming the variable (see README "Configuration").
 */
const EnvSchema = z.object({
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().min(1).default('127.0.0.1'),
  DATABASE_FILE: z.string().min(1).default(path.join(repoRoot, 'data', 'headroom.sqlite')),
  DATABASE_URL: z.string().url().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  JSON_BODY_LIMIT: z.string().default('5mb'),
  SAMPLE_BODY_LIMIT: z.string().default('2gb'),
  CORS_ORIGINS: z.string().default(''),
  TRUST_PROXY: z.string().regex(/^(|\d{1,2}|[\w.:/, ]+)$/, 'a hop count, or addresses/subnets such as "loopback, 10.0.0.0/8"').default(''),
  RATE_LIMIT_PER_MINUTE: z.coerce.number().int().min(1).default(1200),
  RATE_LIMIT_IP_PER_MINUTE: z.coerce.number().int().min(1).default(2400),
  SIGN_IN_FAILURES_PER_15_MIN: z.coerce.number().int().min(1).default(10),
  PASSWORD_RESETS_PER_HOUR: z.coerce.number().int().min(1).default(5),
  MAX_CONCURRENT_REQUESTS: z.coerce.number().int().min(1).default(32),
  PUBLIC_URL: z.string().url().optional(),
  SEED_DEMO: booleanFromEnv.default(true),
  DASHBOARD_DIR: z.string().default(path.join(repoRoot, 'dashboard', 'dist')),
  SMTP_URL: z.string().optional(),
  MAIL_FROM: z.string().default('Headroom <no-reply@headroom.local>'),
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
});

export interface Config {
  port: number;
  host: string;
  databaseFile: string;
  databaseUrl: string | undefined;
  logLevel: z.infer<typeof EnvSchema>['LOG_LEVEL'];
  jsonBodyLimit: string;
  sampleBodyLimit: string;
  corsOrigins: string[];
  /** Express `trust proxy`: which proxies' X-Forwarded-For to believe (false: none). */
  trustProxy: false | number | string;
  /** Requests per minute per API key or user, per network address, and the stricter account limits. */
  rateLimits: { perCallerPerMinute: number; perIpPerMinute: number; signInFailuresPer15Min: number; passwordResetsPerHour: number };
  /** API requests worked on at once; more are answered 503 with Retry-After at once (load shedding). */
  maxConcurrentRequests: number;
  publicUrl: string;
  seedDemo: boolean;
  dashboardDir: string;
  smtpUrl: string | undefined;
  mailFrom: string;
  env: 'development' | 'production' | 'test';
}

export class ConfigError extends Error {}

/** Reads and checks the environment; throws ConfigError naming every bad variable. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = EnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  return {
    port: e.PORT,
    host: e.HOST,
    databaseFile: e.DATABASE_FILE,
    databaseUrl: e.DATABASE_URL,
    logLevel: e.LOG_LEVEL,
    jsonBodyLimit: e.JSON_BODY_LIMIT,
    sampleBodyLimit: e.SAMPLE_BODY_LIMIT,
    corsOrigins: e.CORS_ORIGINS.split(',')
      .map((s) => s.trim())
      .filter(Boolean),
    trustProxy: e.TRUST_PROXY === '' ? false : /^\d+$/.test(e.TRUST_PROXY) ? Number(e.TRUST_PROXY) : e.TRUST_PROXY,
    rateLimits: {
      perCallerPerMinute: e.RATE_LIMIT_PER_MINUTE,
      perIpPerMinute: e.RATE_LIMIT_IP_PER_MINUTE,
      signInFailuresPer15Min: e.SIGN_IN_FAILURES_PER_15_MIN,
      passwordResetsPerHour: e.PASSWORD_RESETS_PER_HOUR,
    },
    maxConcurrentRequests: e.MAX_CONCURRENT_REQUESTS,
    publicUrl: e.PUBLIC_URL ?? `http://localhost:${e.PORT}`,
    seedDemo: e.SEED_DEMO,
    dashboardDir: e.DASHBOARD_DIR,
    smtpUrl: e.SMTP_URL,
    mailFrom: e.MAIL_FROM,
    env: e.NODE_ENV,
  };
}

/**
 * Config for tests: an in-memory database, silent logs, no demo seed, general rate limits high enough
 * for bulk tests (the sign-in and reset limits keep their defaults).
 */
export function testConfig(overrides: Partial<Config> = {}): Config {
  return {
    ...loadConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent', SEED_DEMO: 'false', RATE_LIMIT_PER_MINUTE: '1000000', RATE_LIMIT_IP_PER_MINUTE: '1000000' }),
    databaseFile: ':memory:',
    ...overrides,
  };
}
