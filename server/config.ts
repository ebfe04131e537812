import { randomBytes } from 'node:crypto';
import path from 'node:path';

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
  };
}
