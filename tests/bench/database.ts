/**
 * The benchmark's own private MariaDB (a fresh folder under .data/bench-<pid>/, removed at the end),
 * a server config pointing at it, and raw `mariadb` connector connections for the baselines.
 */
import { rmSync } from 'node:fs';
import path from 'node:path';
import mariadb, { type Connection } from 'mariadb';
import { defaultConfig, ROOT_DIR, type ServerConfig } from '../../server/config';
import { ensureDatabase, ensureMariadbInstalled, type MariadbInstance, startMariadb } from '../../server/ops/mariadb';
import { freePort } from '../support/global-mariadb';

/** The built console (`npm run build`), served when present. */
export const CLIENT_DIR = path.join(ROOT_DIR, 'dist', 'client');

export interface BenchDatabase {
  db: MariadbInstance;
  config: ServerConfig;
  version: string;
  /** A direct connection of the raw connector (no pool, no Sequelize). */
  rawConnection(): Promise<Connection>;
  remove(): Promise<void>;
}

export async function startBenchDatabase(): Promise<BenchDatabase> {
  const baseDir = path.join(ROOT_DIR, '.data', `bench-${process.pid}`);
  rmSync(baseDir, { recursive: true, force: true });
  await ensureMariadbInstalled();
  const db = await startMariadb({ baseDir, port: await freePort(), bufferPool: '1G' });
  const creds = { database: 'sscope_bench', user: 'sscope_bench', password: 'bench-only' };
  await ensureDatabase(db, creds.database, creds.user, creds.password);
  const version = (await db.adminSql('SELECT VERSION()')).trim();
  const config = defaultConfig({
    port: 0,
    clientDir: CLIENT_DIR,
    dataDir: path.join(baseDir, 'files'),
    sessionSecret: 'bench-secret',
    loginAttempts: 1000,
    db: { host: '127.0.0.1', port: db.port, ...creds },
  });
  return {
    db,
    config,
    version,
    rawConnection: () => mariadb.createConnection({ host: '127.0.0.1', port: db.port, ...creds }),
    remove: async () => {
      await db.stop();
      rmSync(baseDir, { recursive: true, force: true });
    },
  };
}
