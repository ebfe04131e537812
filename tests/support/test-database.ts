import { execFile } from 'node:child_process';
import { userInfo } from 'node:os';
import { promisify } from 'node:util';
import { inject } from 'vitest';
import { type ServerConfig, defaultConfig } from '../../server/config';

const run = promisify(execFile);
let counter = 0;

/** A fresh, empty database in the test project's private MariaDB; returns a server config pointing at it. */
export async function freshDatabase(overrides: Partial<ServerConfig> = {}): Promise<ServerConfig> {
  const { port, socket, baseDir } = inject('mariadb');
  const name = `sscope_t_${process.pid}_${++counter}`;
  await run('mariadb', ['--no-defaults', `--socket=${socket}`, `-u${userInfo().username}`, '-e', `CREATE DATABASE ${name} CHARACTER SET utf8mb4`]);
  return defaultConfig({
    port: 0,
    clientDir: null,
    dataDir: `${baseDir}/files-${name}`,
    sessionSecret: 'test-secret',
    db: { host: '127.0.0.1', port, database: name, user: 'sscope_test', password: 'sscope-test' },
    ...overrides,
  });
}
