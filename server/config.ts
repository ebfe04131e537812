import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { z } from 'zod';

/** Runtime settings of one server process. Everything has a working default for `npm start`. */
export interface ServerConfig {
  host: string;
  port: number;
  db: { host: string; port: number; database: string; user: string; password: string };
  /** Folder for uploads, journals and other files kept outside the web root. */
  dataDir: string;
  /** Built client (vite build output); served when present. */
  clientDir: string | null;
  sessionSecret: string;
  /** Cookie `Secure` flag: on when the app sits behind TLS. */
  secureCookies: boolean;
  /** Idle and absolute session lifetimes, ms. */
  sessionIdleMs: number;
  sessionAbsoluteMs: number;
  /** Sign-in attempts allowed per account and address in `loginWindowMs`. */
  loginAttempts: number;
  loginWindowMs: number;
  /**
   * A run is signed by someone other than the engineer who submitted it (default on; `SSCOPE_SECOND_SIGNER=0`
   * turns it off for a one-engineer office, and each such signature is audited as an exception).
   */
  secondSigner: boolean;
  /** Outgoing mail: a real SMTP server, or (smtp null) the local catcher the demo and the tests read. */
  mail: MailConfig;
}

/** How the connection to the SMTP server is secured: TLS from the first byte, an upgrade by STARTTLS (required), or none. */
export const SMTP_SECURITY = ['tls', 'starttls', 'none'] as const;
export type SmtpSecurity = (typeof SMTP_SECURITY)[number];

/** A real SMTP server, as the environment names it. */
export interface SmtpServer {
  host: string;
  port: number;
  security: SmtpSecurity;
  auth: { user: string; password: string } | null;
  /** PEM certificate(s) trusted for the server besides the system's (SSCOPE_SMTP_CA_FILE's content). */
  ca: string | null;
}

export interface MailConfig {
  /** null: start the local catcher (smtp-server on 127.0.0.1) and send to it. */
  smtp: SmtpServer | null;
  /** The catcher's port when there is no real server (0 = any free port). */
  catcherPort: number;
  /** Sender address of everything the app sends. */
  from: string;
}

/** The port a security mode is served on unless SSCOPE_SMTP_PORT says otherwise (RFC 8314 465, RFC 6409 587, RFC 5321 25). */
const DEFAULT_SMTP_PORT: Record<SmtpSecurity, number> = { tls: 465, starttls: 587, none: 25 };

// An empty variable counts as unset (a blank line in an env file).
const optional = <T extends z.ZodType>(schema: T) => z.preprocess((v) => (v === '' ? undefined : v), schema.optional());
const port = z.coerce.number().int('a whole number').min(0).max(65535);

const mailEnvSchema = z
  .object({
    SSCOPE_SMTP_HOST: optional(z.string().trim().min(1)),
    SSCOPE_SMTP_PORT: optional(port),
    SSCOPE_SMTP_SECURITY: optional(z.enum(SMTP_SECURITY, { error: `one of ${SMTP_SECURITY.join(', ')}` })),
    SSCOPE_SMTP_USER: optional(z.string()),
    SSCOPE_SMTP_PASSWORD: optional(z.string()),
    SSCOPE_SMTP_CA_FILE: optional(z.string()),
    SSCOPE_MAIL_FROM: optional(z.email('an e-mail address')),
  })
  .superRefine((env, ctx) => {
    if ((env.SSCOPE_SMTP_USER === undefined) !== (env.SSCOPE_SMTP_PASSWORD === undefined)) {
      const missing = env.SSCOPE_SMTP_USER === undefined ? 'SSCOPE_SMTP_USER' : 'SSCOPE_SMTP_PASSWORD';
      ctx.addIssue({ code: 'custom', path: [missing], message: 'required with the other of SSCOPE_SMTP_USER and SSCOPE_SMTP_PASSWORD' });
    }
    if (env.SSCOPE_SMTP_HOST === undefined)
      for (const name of ['SSCOPE_SMTP_SECURITY', 'SSCOPE_SMTP_USER', 'SSCOPE_SMTP_PASSWORD', 'SSCOPE_SMTP_CA_FILE'] as const)
        if (env[name] !== undefined) ctx.addIssue({ code: 'custom', path: [name], message: 'set without SSCOPE_SMTP_HOST (the local catcher takes none)' });
    if (env.SSCOPE_SMTP_HOST !== undefined && env.SSCOPE_SMTP_PORT === 0)
      ctx.addIssue({ code: 'custom', path: ['SSCOPE_SMTP_PORT'], message: 'a real server’s port, 1–65535' });
  });

/**
 * The mail settings from environment variables, checked once at start-up; a wrong one stops the start
 * with an error naming the variable (and never echoing the password).
 */
export function mailConfigFromEnv(env: Record<string, string | undefined> = process.env): MailConfig {
  const parsed = mailEnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${String(i.path[0] ?? 'mail settings')}: ${i.message}`);
    throw new Error(`Invalid mail settings:\n  ${lines.join('\n  ')}`);
  }
  const e = parsed.data;
  const from = e.SSCOPE_MAIL_FROM ?? 'reports@settlescope.local';
  if (e.SSCOPE_SMTP_HOST === undefined) return { smtp: null, catcherPort: e.SSCOPE_SMTP_PORT ?? 0, from };
  const security = e.SSCOPE_SMTP_SECURITY ?? 'starttls';
  let ca: string | null = null;
  if (e.SSCOPE_SMTP_CA_FILE !== undefined) {
    try {
      ca = readFileSync(e.SSCOPE_SMTP_CA_FILE, 'utf8');
    } catch (err) {
      throw new Error(`Invalid mail settings:\n  SSCOPE_SMTP_CA_FILE: cannot read ${e.SSCOPE_SMTP_CA_FILE} (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`);
    }
    if (!ca.includes('-----BEGIN CERTIFICATE-----')) throw new Error(`Invalid mail settings:\n  SSCOPE_SMTP_CA_FILE: ${e.SSCOPE_SMTP_CA_FILE} holds no PEM certificate`);
  }
  return {
    smtp: {
      host: e.SSCOPE_SMTP_HOST,
      port: e.SSCOPE_SMTP_PORT ?? DEFAULT_SMTP_PORT[security],
      security,
      auth: e.SSCOPE_SMTP_USER !== undefined && e.SSCOPE_SMTP_PASSWORD !== undefined ? { user: e.SSCOPE_SMTP_USER, password: e.SSCOPE_SMTP_PASSWORD } : null,
      ca,
    },
    catcherPort: 0,
    from,
  };
}

export const ROOT_DIR = path.resolve(import.meta.dirname, '..');

export function defaultConfig(overrides: Partial<ServerConfig> = {}): ServerConfig {
  const env = process.env;
  return {
    host: '127.0.0.1',
    port: Number(env.PORT ?? 8080),
    db: {
      host: '127.0.0.1',
      port: Number(env.SSCOPE_DB_PORT ?? 3307),
      database: env.SSCOPE_DB_NAME ?? 'settlescope',
      user: env.SSCOPE_DB_USER ?? 'settlescope',
      password: env.SSCOPE_DB_PASSWORD ?? 'settlescope-local',
    },
    dataDir: path.resolve(env.SSCOPE_DATA_DIR ?? path.join(ROOT_DIR, '.data')),
    clientDir: path.join(ROOT_DIR, 'dist', 'client'),
    sessionSecret: env.SSCOPE_SESSION_SECRET ?? randomBytes(32).toString('hex'),
    secureCookies: env.SSCOPE_SECURE_COOKIES === '1',
    sessionIdleMs: 8 * 3600_000,
    sessionAbsoluteMs: 24 * 3600_000,
    loginAttempts: 10,
    loginWindowMs: 15 * 60_000,
    secondSigner: env.SSCOPE_SECOND_SIGNER !== '0',
    ...overrides,
    // Read only when not given: a caller that names its mail server (a test) needs no environment for it.
    mail: overrides.mail ?? mailConfigFromEnv(env),
  };
}
