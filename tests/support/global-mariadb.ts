/**
 * Vitest global setup: one throw-away private MariaDB per test project, on its own port and folder.
 * Test files create their own databases in it (see test-database.ts).
 */
import { rmSync } from 'node:fs';
import { type AddressInfo, createServer } from 'node:net';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { ROOT_DIR } from '../../server/config';
import { ensureMariadbInstalled, startMariadb } from '../../server/ops/mariadb';

/** A port nobody listens on now (so parallel test runs on one machine do not collide). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as AddressInfo;
      probe.close(() => resolve(port));
    });
  });
}

declare module 'vitest' {
  export interface ProvidedContext {
    mariadb: { port: number; socket: string; baseDir: string };
  }
}

export default async function setup(project: TestProject) {
  const name = project.name;
  const port = Number(process.env.SSCOPE_TEST_DB_PORT ?? (await freePort()));
  const baseDir = path.join(ROOT_DIR, '.data', `test-${name}-${process.pid}`);
  rmSync(baseDir, { recursive: true, force: true });
  await ensureMariadbInstalled();
  const db = await startMariadb({ baseDir, port, bufferPool: '64M' });
  await db.adminSql(
    "CREATE USER IF NOT EXISTS 'sscope_test'@'127.0.0.1' IDENTIFIED BY 'sscope-test'; GRANT ALL PRIVILEGES ON `sscope\\_t\\_%`.* TO 'sscope_test'@'127.0.0.1';",
  );
  project.provide('mariadb', { port, socket: db.socket, baseDir });
  return async () => {
    await db.stop();
    rmSync(baseDir, { recursive: true, force: true });
  };
}
