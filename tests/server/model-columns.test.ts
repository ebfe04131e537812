import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrate } from '../../server/db/migrator';
import { initModels } from '../../server/db/models';
import { createSequelize } from '../../server/db/sequelize';
import { freshDatabase } from '../support/test-database';

const sequelize = createSequelize((await freshDatabase()).db);
initModels(sequelize);
beforeAll(async () => {
  await migrate(sequelize);
});
afterAll(() => sequelize.close());

// A shared or misspelt attribute definition loses data silently: two attributes on one column keep
// only the last one written, and a column the migrations never made fails only at the first write.
describe('every model attribute', () => {
  const models = Object.values(sequelize.models);

  it('covers the models the app defines', () => {
    expect(models.map((m) => m.name)).toEqual(expect.arrayContaining(['Instrument', 'CalibrationRecord', 'TestLocation', 'TestPlan', 'Rig', 'Run']));
  });

  for (const model of models) {
    it(`${model.name}: has its own column, and the column exists`, async () => {
      const attributes = Object.entries(model.getAttributes()).filter(([, a]) => !('type' in a && a.type?.constructor?.name === 'VIRTUAL'));
      const fields = attributes.map(([, a]) => a.field);
      expect(new Set(fields).size, `attributes sharing a column: ${fields.filter((f, i) => fields.indexOf(f) !== i).join(', ')}`).toBe(fields.length);
      const columns = Object.keys(await sequelize.getQueryInterface().describeTable(model.getTableName()));
      expect(columns).toEqual(expect.arrayContaining(fields));
    });
  }
});
