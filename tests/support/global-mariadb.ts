/**
 * Vitest global setup: one throw-away private MariaDB per test project, on its own port and folder,
 * holding a template database migrated and demo-seeded once per run. Test files get their own
 * databases in it, empty or cloned from the template (see test-database.ts), so no file repeats the
 * migrations or the demo seeding (whose password hashing is deliberately slow).
 */
import { existsSync, rmSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import type { TestProject } from 'vitest/node';
import { ROOT_DIR } from '../../server/config';
import { migrate } from '../../server/db/migrator';
import { initModels } from '../../server/db/models';
import { createSequelize } from '../../server/db/sequelize';
import { ensureMariadbInstalled, startMariadb } from '../../server/ops/mariadb';
import { seedDemo } from '../../server/seed/demo';
import { freePort } from './free-port';

export { freePort };

const TEMPLATE_DB = 'sscope_template';

declare module 'vitest' {
  export interface ProvidedContext {
    mariadb: {
      port: number;
      socket: string;
      baseDir: string;
      /** The template database: its name, its tables' names and `CREATE TABLE` statements (foreign keys included). */
      template: { name: string; creates: string[]; tables: string[] };
    };
  }
}

/** Migrates and seeds the template through its own account, then reads back its tables' definitions. */
async function buildTemplate(port: number, adminSql: (sql: string) => Promise<string>) {
  await adminSql(
    `CREATE DATABASE ${TEMPLATE_DB} CHARACTER SET utf8mb4; CREATE USER IF NOT EXISTS 'sscope_tpl'@'127.0.0.1' IDENTIFIED BY 'sscope-tpl'; GRANT ALL PRIVILEGES ON ${TEMPLATE_DB}.* TO 'sscope_tpl'@'127.0.0.1';`,
  );
  const sequelize = createSequelize({ host: '127.0.0.1', port, database: TEMPLATE_DB, user: 'sscope_tpl', password: 'sscope-tpl' });
  try {
    initModels(sequelize);
    await migrate(sequelize);
    await seedDemo();
    const rows = await sequelize.query<{ name: string }>(
      `SELECT table_name AS name FROM information_schema.tables WHERE table_schema = '${TEMPLATE_DB}' AND table_type = 'BASE TABLE' ORDER BY table_name`,
      { type: QueryTypes.SELECT },
    );
    const tables = rows.map((r) => r.name);
    const creates: string[] = [];
    for (const table of tables) {
      const [row] = await sequelize.query<Record<string, string>>(`SHOW CREATE TABLE \`${table}\``, { type: QueryTypes.SELECT });
      creates.push(row!['Create Table']!);
    }
    return { name: TEMPLATE_DB, creates, tables };
  } finally {
    await sequelize.close();
    await adminSql(`DROP USER 'sscope_tpl'@'127.0.0.1'`);
  }
}

/**
 * Where test databases (and the files of the servers over them) live: in RAM (tmpfs /dev/shm) where the
 * machine has it, since on disk every table created and every commit waits for an fsync (cloning the
 * template takes about 1 s on disk and 0.15 s in RAM here); SSCOPE_TEST_DATA_DIR chooses another folder.
 * Nothing in them outlives the run.
 */
function testDataRoot(): string {
  if (process.env.SSCOPE_TEST_DATA_DIR) return process.env.SSCOPE_TEST_DATA_DIR;
  return existsSync('/dev/shm') ? path.join('/dev/shm', 'settlescope') : path.join(ROOT_DIR, '.data');
}

export default async function setup(project: TestProject) {
  const name = project.name;
  const port = Number(process.env.SSCOPE_TEST_DB_PORT ?? (await freePort()));
  const baseDir = path.join(testDataRoot(), `test-${name}-${process.pid}`);
  rmSync(baseDir, { recursive: true, force: true });
  await ensureMariadbInstalled();
  const db = await startMariadb({ baseDir, port, bufferPool: '64M' });
  await db.adminSql(
    "CREATE USER IF NOT EXISTS 'sscope_test'@'127.0.0.1' IDENTIFIED BY 'sscope-test'; GRANT ALL PRIVILEGES ON `sscope\\_t\\_%`.* TO 'sscope_test'@'127.0.0.1';",
  );
  const template = await buildTemplate(port, db.adminSql);
  project.provide('mariadb', { port, socket: db.socket, baseDir, template });
  return async () => {
    await db.stop();
    rmSync(baseDir, { recursive: true, force: true });
  };
}
