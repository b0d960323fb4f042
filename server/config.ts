/**
 * Environment variables, validated once. Everything else reads the `Config` object.
 */
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { isIP } from 'node:net';
import { join, resolve } from 'node:path';
import { z } from 'zod';
import { LOG_LEVELS, type LogLevel } from './logging';

const envSchema = z.object({
  NODE_ENV: z.string().optional(),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  RUNNEL_DATA_DIR: z.string().default('./.data'),
  DATABASE_URL: z
    .string()
    .regex(/^postgres(ql)?:\/\//, 'must start with postgres://')
    .optional(),
  SESSION_SECRET: z.string().min(16, 'must be at least 16 characters').optional(),
  SMTP_HOST: z.string().optional(),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(587),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  MAIL_FROM: z.string().default('Runnel <no-reply@runnel.test>'),
  PUBLIC_URL: z.url().optional(),
  COOKIE_SECURE: z.enum(['true', 'false']).optional(),
  /**
   * Express 'trust proxy' behind a TLS-terminating proxy or load balancer: a hop count (how many
   * proxies sit in front) or a comma-separated list of proxy addresses/subnets. `true` is refused:
   * it would trust every X-Forwarded-For, letting any client choose its own IP (and its sign-in budget).
   */
  /** Password checks (sign-in, sign-up) allowed per client IP per 15 minutes. */
  /** Lowest level of the JSON log (server/logging.ts). */
  LOG_LEVEL: z.enum(LOG_LEVELS).default('info'),
  PASSWORD_CHECKS_PER_IP: z.coerce.number().int().min(1).max(1_000_000).default(50),
  TRUST_PROXY: z
    .string()
    .optional()
    .superRefine((value, ctx) => {
      if (value === undefined || value === '') return;
      const problem = trustProxyProblem(value);
      if (problem) ctx.addIssue({ code: 'custom', message: problem });
    }),
});

export interface SmtpConfig {
  host: string;
  port: number;
  user?: string;
  pass?: string;
}

export interface Config {
  production: boolean;
  port: number;
  host: string;
  /** Absolute path; holds the PGlite database (pg/) and the generated session secret. */
  dataDir: string;
  databaseUrl?: string;
  sessionSecret: string;
  /** Outgoing SMTP server; absent → the app starts its own capture sink (server/mail/sink.ts). */
  smtp?: SmtpConfig;
  mailFrom: string;
  /** Base of links in e-mails (no trailing slash). */
  publicUrl: string;
  cookieSecure: boolean;
  /** Password checks allowed per client IP per 15 minutes (server/auth/password-budget.ts). */
  passwordChecksPerIp?: number;
  /** Express 'trust proxy': a hop count or a list of proxy addresses (absent: do not trust X-Forwarded-*). */
  trustProxy?: number | string[];
  /** Lowest level logged (LOG_LEVEL; default info). */
  logLevel?: LogLevel;
}

/** Reads the session secret from the data dir, creating it on first start. */
function persistedSecret(dataDir: string): string {
  const file = join(dataDir, 'session-secret');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(32).toString('base64url');
  writeFileSync(file, secret + '\n', { mode: 0o600 });
  return secret;
}

/** Validates `env` (default process.env); throws one readable error listing every bad variable. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  const production = e.NODE_ENV === 'production';
  const dataDir = resolve(e.RUNNEL_DATA_DIR);
  return {
    production,
    port: e.PORT,
    host: e.HOST,
    dataDir,
    databaseUrl: e.DATABASE_URL,
    sessionSecret: e.SESSION_SECRET ?? persistedSecret(dataDir),
    smtp: e.SMTP_HOST ? { host: e.SMTP_HOST, port: e.SMTP_PORT, user: e.SMTP_USER, pass: e.SMTP_PASS } : undefined,
    mailFrom: e.MAIL_FROM,
    publicUrl: (e.PUBLIC_URL ?? `http://localhost:${e.PORT}`).replace(/\/+$/, ''),
    cookieSecure: e.COOKIE_SECURE ? e.COOKIE_SECURE === 'true' : production,
    trustProxy: parseTrustProxy(e.TRUST_PROXY),
    passwordChecksPerIp: e.PASSWORD_CHECKS_PER_IP,
    logLevel: e.LOG_LEVEL,
  };
}

/** Names Express (proxy-addr) accepts for common private ranges. */
const PROXY_NAMES = new Set(['loopback', 'linklocal', 'uniquelocal']);

function isProxyAddress(entry: string): boolean {
  if (PROXY_NAMES.has(entry)) return true;
  const [address, bits, ...rest] = entry.split('/');
  if (rest.length || !(isIP(address) || false)) return false;
  if (bits === undefined) return true;
  const max = isIP(address) === 4 ? 32 : 128;
  return /^\d+$/.test(bits) && Number(bits) <= max;
}

/** Why a TRUST_PROXY value is refused, or null. */
export function trustProxyProblem(value: string): string | null {
  if (/^(true|false|yes|no|on|off)$/i.test(value.trim())) {
    return (
      'must be a hop count (e.g. 1) or a comma-separated list of proxy addresses (e.g. 10.0.0.5,10.0.1.0/24, loopback); ' +
      '"true" would trust any X-Forwarded-For and let a client choose its own IP'
    );
  }
  if (/^\d+$/.test(value.trim())) return Number(value) <= 10 ? null : 'a hop count must be 10 or fewer';
  const bad = value
    .split(',')
    .map((e) => e.trim())
    .filter((e) => !isProxyAddress(e));
  return bad.length ? `is not a hop count nor a list of proxy addresses: ${bad.map((b) => JSON.stringify(b)).join(', ')}` : null;
}

function parseTrustProxy(value: string | undefined): number | string[] | undefined {
  if (value === undefined || value.trim() === '') return undefined;
  if (/^\d+$/.test(value.trim())) return Number(value);
  return value.split(',').map((e) => e.trim());
}
