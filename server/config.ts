import { availableParallelism } from 'node:os';
import { resolve } from 'node:path';
/**
 * Server configuration, read once from the environment. Every variable has a default for the
 * embedded mode that `npm start` runs; README.md lists them all.
 */
export interface ServerConfig {
  /** TCP port the one Express process listens on. */
  port: number;
  /** Interface to bind; loopback unless told otherwise. */
  host: string;
  /** PostgreSQL connection URL. */
  databaseUrl: string;
  /** Secret that signs sign-in tokens (HS256). */
  jwtSecret: string;
  /** Token lifetime as jsonwebtoken reads it (`8h`, `30m`, seconds as a number string). */
  tokenTtl: string;
  /** Sign-in attempts allowed per client address and e-mail in `loginWindowMs`. */
  loginRateLimit: number;
  /** Length of the sign-in rate-limit window. */
  loginWindowMs: number;
  /** pino log level (`silent` in tests). */
  logLevel: string;
  /** Folder of the built Angular app, served with an SPA fallback; empty for an API-only server. */
  staticDir: string;
  /** Outgoing mail: the local fake SMTP server in the embedded mode. */
  smtp: { host: string; port: number; secure: boolean; user?: string; password?: string; from: string };
  /** Address the app is reached at, for links in e-mails. */
  publicUrl: string;
  /** How long an e-mailed set-password link works, by purpose, in milliseconds. */
  accountLinks: { invitationTtlMs: number; passwordResetTtlMs: number };
  /** Worker threads that solve matches (one per core by default); 0 solves on the event loop. */
  solveThreads: number;
}

/** Reads the configuration from `env` (defaults: the embedded mode of `npm start`). */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): ServerConfig {
  const port = intVar(env, 'PORT', 4300);
  const host = env.HOST ?? '127.0.0.1';
  const jwtSecret = env.JWT_SECRET ?? '';
  if (jwtSecret.length < 32) {
    throw new Error('JWT_SECRET must be set to at least 32 characters (npm start generates one in .local/jwt-secret).');
  }
  return {
    port,
    host,
    databaseUrl: env.DATABASE_URL ?? 'postgres://postgres@127.0.0.1:54329/shelfmatch',
    jwtSecret,
    tokenTtl: env.TOKEN_TTL ?? '8h',
    loginRateLimit: intVar(env, 'LOGIN_RATE_LIMIT', 10),
    loginWindowMs: intVar(env, 'LOGIN_RATE_WINDOW_MS', 15 * 60 * 1000),
    logLevel: env.LOG_LEVEL ?? 'info',
    staticDir: env.STATIC_DIR ? resolve(env.STATIC_DIR) : '',
    smtp: {
      host: env.SMTP_HOST ?? '127.0.0.1',
      port: intVar(env, 'SMTP_PORT', 2525),
      secure: env.SMTP_SECURE === 'true',
      user: env.SMTP_USER || undefined,
      password: env.SMTP_PASSWORD || undefined,
      from: env.MAIL_FROM ?? 'Shelfmatch <shelfmatch@tarnwick.example>',
    },
    publicUrl: env.PUBLIC_URL ?? `http://127.0.0.1:${port}`,
    accountLinks: {
      invitationTtlMs: intVar(env, 'INVITATION_TTL_HOURS', 7 * 24) * 3_600_000,
      passwordResetTtlMs: intVar(env, 'PASSWORD_RESET_TTL_MINUTES', 60) * 60_000,
    },
    solveThreads: intVar(env, 'SOLVE_THREADS', Math.max(1, availableParallelism())),
  };
}

function intVar(env: NodeJS.ProcessEnv, name: string, fallback: number): number {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0) throw new Error(`${name} must be a whole number, got "${raw}".`);
  return n;
}
