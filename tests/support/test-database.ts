import { execFile } from 'node:child_process';
import { userInfo } from 'node:os';
import { promisify } from 'node:util';
import { inject } from 'vitest';
import { type ServerConfig, defaultConfig } from '../../server/config';

const run = promisify(execFile);
let counter = 0;

/** SQL as the administrative account over the project's private socket (one client call, many statements). */
async function adminSql(sql: string): Promise<void> {
  const { socket } = inject('mariadb');
  await run('mariadb', ['--no-defaults', `--socket=${socket}`, `-u${userInfo().username}`, '-e', sql], { maxBuffer: 16 << 20 });
}

function configFor(name: string, overrides: Partial<ServerConfig>): ServerConfig {
  const { port, baseDir } = inject('mariadb');
  return defaultConfig({
    port: 0,
    clientDir: null,
    dataDir: `${baseDir}/files-${name}`,
    sessionSecret: 'test-secret',
    db: { host: '127.0.0.1', port, database: name, user: 'sscope_test', password: 'sscope-test' },
    // Always the local catcher, whatever SSCOPE_SMTP_* the shell has: tests never send real mail.
    mail: { smtp: null, catcherPort: 0, from: 'reports@settlescope.local' },
    ...overrides,
  });
}

const nextName = () => `sscope_t_${process.pid}_${++counter}`;

/** A fresh, empty database in the test project's private MariaDB; returns a server config pointing at it. */
export async function freshDatabase(overrides: Partial<ServerConfig> = {}): Promise<ServerConfig> {
  const name = nextName();
  await adminSql(`CREATE DATABASE ${name} CHARACTER SET utf8mb4`);
  return configFor(name, overrides);
}

/**
 * A fresh database already migrated and demo-seeded: a copy of the run's template (global-mariadb.ts),
 * tables created from the template's own definitions (foreign keys and auto-increment counters
 * included, which `CREATE TABLE … LIKE` would drop) and filled with `INSERT … SELECT`, in one client call.
 */
export async function seededDatabase(overrides: Partial<ServerConfig> = {}): Promise<ServerConfig> {
  const { template } = inject('mariadb');
  const name = nextName();
  await adminSql(
    [
      `CREATE DATABASE ${name} CHARACTER SET utf8mb4`,
      `USE ${name}`,
      'SET FOREIGN_KEY_CHECKS = 0',
      ...template.creates,
      ...template.tables.map((t) => `INSERT INTO \`${t}\` SELECT * FROM ${template.name}.\`${t}\``),
    ].join(';\n'),
  );
  return configFor(name, overrides);
}
