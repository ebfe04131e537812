import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMigrator, migrate } from '../../server/db/migrator';
import { createSequelize } from '../../server/db/sequelize';
import { freshDatabase } from '../support/test-database';

const sequelize = createSequelize((await freshDatabase()).db);
beforeAll(() => sequelize.authenticate());
afterAll(() => sequelize.close());

const tables = async () =>
  ((await sequelize.query('SELECT table_name AS t FROM information_schema.tables WHERE table_schema = DATABASE() ORDER BY 1', { type: 'SELECT' })) as { t: string }[]).map((r) => r.t);

describe('migrations', () => {
  it('build every table from an empty database, roll back, and build again', async () => {
    expect(await tables()).toEqual([]);
    const applied = await migrate(sequelize);
    expect(applied).toContain('0001-initial');
    const built = await tables();
    for (const t of ['users', 'organizations', 'sessions', 'projects', 'test_locations', 'test_plans', 'instruments', 'calibrations', 'runs', 'run_events', 'samples', 'audit_log']) {
      expect(built).toContain(t);
    }
    expect(await migrate(sequelize)).toEqual([]); // idempotent
    await createMigrator(sequelize).down({ to: 0 });
    expect(await tables()).toEqual(['schema_migrations']);
    await migrate(sequelize);
    expect(await tables()).toEqual(built);
  });

  it('keys samples by (run, seq) so a replayed batch cannot duplicate', async () => {
    const keys = (await sequelize.query("SELECT index_name AS i, GROUP_CONCAT(column_name ORDER BY seq_in_index) AS c FROM information_schema.statistics WHERE table_schema = DATABASE() AND table_name = 'samples' GROUP BY index_name ORDER BY 1", { type: 'SELECT' })) as { i: string; c: string }[];
    expect(keys).toEqual([
      { i: 'PRIMARY', c: 'run_id,seq' },
      { i: 'samples_run_time', c: 'run_id,t_ms' },
    ]);
  });
});
