import { DataTypes, Model, QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { recoverInstrumentFields } from '../../server/db/migrations/0009-instrument-fields';
import { createMigrator, migrate } from '../../server/db/migrator';
import { initModels } from '../../server/db/models';
import { createSequelize } from '../../server/db/sequelize';
import { Instrument } from '../../server/models/instrument';
import { audit } from '../../server/services/audit';
import { freshDatabase } from '../support/test-database';

const sequelize = createSequelize((await freshDatabase()).db);
initModels(sequelize);

/** The instrument model as it was before migration 0009: one attribute object shared by four attributes. */
class FaultyInstrument extends Model {}
const num = { type: DataTypes.DOUBLE, allowNull: true };
FaultyInstrument.init(
  {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    kind: DataTypes.STRING,
    makeModel: DataTypes.STRING,
    serialNumber: DataTypes.STRING,
    rangeMin: num,
    rangeMax: num,
    unit: DataTypes.STRING,
    resolution: num,
    travelMm: num,
    notes: DataTypes.TEXT,
    createdAt: DataTypes.DATE(3),
    updatedAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'instruments', modelName: 'FaultyInstrument' },
);

const entered = (serialNumber: string, kind: string, unit: string, rangeMin: number | null, rangeMax: number | null, resolution: number | null, travelMm: number | null) => ({
  kind,
  makeModel: 'Test kit',
  serialNumber,
  rangeMin,
  rangeMax,
  unit,
  resolution,
  travelMm,
  notes: '',
});

// As the register's routes did it: the write, then an audit entry of the record as it stood in memory.
async function createViaApi(body: ReturnType<typeof entered>) {
  const i = await FaultyInstrument.create(body);
  await audit({ userId: null, entity: 'instrument', entityId: i.get('id') as number, action: 'created', after: i.get({ plain: true }) });
  return i.get('id') as number;
}
async function updateViaApi(id: number, body: ReturnType<typeof entered>) {
  const i = (await FaultyInstrument.findByPk(id))!;
  // A copy, as the route's instrument (loaded with its calibrations) gives.
  const before = { ...i.get({ plain: true }) };
  await i.update(body);
  await audit({ userId: null, entity: 'instrument', entityId: id, action: 'updated', before, after: i.get({ plain: true }) });
}
const fields = async (id: number) => {
  const i = (await Instrument.findByPk(id))!;
  return { rangeMin: i.rangeMin, rangeMax: i.rangeMax, resolution: i.resolution, travelMm: i.travelMm, notes: i.notes };
};

beforeAll(async () => {
  await migrate(sequelize);
  await createMigrator(sequelize).down({ to: '0009-instrument-fields' });
});
afterAll(() => sequelize.close());

describe('migration 0009 repairs the instrument register', () => {
  it('reproduces the fault: four attributes on one column, the last written wins', async () => {
    const id = await createViaApi(entered('R-0', 'gauge', 'mm', 0, 25, 0.001, 25));
    const [row] = await sequelize.query('SELECT range_min, range_max, resolution, travel_mm FROM instruments WHERE id = ?', { replacements: [id], type: QueryTypes.SELECT });
    expect(row).toEqual({ range_min: 25, range_max: null, resolution: null, travel_mm: null });
  });

  it('recovers what was entered through the API, created and later changed, and what it can of unaudited rows', async () => {
    const gauge = await createViaApi(entered('R-1', 'gauge', 'mm', 0, 25, 0.001, 25));
    const transducer = await createViaApi(entered('R-2', 'pressure', 'bar', 0, 700, 0.1, null));
    const changed = await createViaApi(entered('R-3', 'gauge', 'mm', 0, 50, 0.01, 50));
    await updateViaApi(changed, entered('R-3', 'gauge', 'mm', 0, 50, 0.002, 50));
    await updateViaApi(changed, entered('R-3', 'gauge', 'mm', 1, 50, 0.002, 50));
    const seeded = (await FaultyInstrument.create(entered('R-4', 'gauge', 'mm', 0, 50, 0.01, 50))).get('id') as number;
    const seededTransducer = (await FaultyInstrument.create(entered('R-5', 'pressure', 'bar', 0, 700, 0.1, null))).get('id') as number;
    // Written with each value in its own column (as by hand, or by a later version of the model).
    await sequelize.query(
      "INSERT INTO instruments (kind, make_model, serial_number, range_min, range_max, unit, resolution, travel_mm, notes, created_at, updated_at) VALUES ('gauge', 'Test kit', 'R-6', 0, 10, 'mm', 0.001, 10, '', NOW(3), NOW(3))",
    );
    const sound = ((await FaultyInstrument.findOne({ where: { serialNumber: 'R-6' } }))!.get('id')) as number;

    expect((await migrate(sequelize))[0]).toBe('0009-instrument-fields');

    expect(await fields(gauge)).toEqual({ rangeMin: 0, rangeMax: 25, resolution: 0.001, travelMm: 25, notes: '' });
    expect(await fields(transducer)).toEqual({ rangeMin: 0, rangeMax: 700, resolution: 0.1, travelMm: null, notes: '' });
    expect(await fields(changed)).toEqual({ rangeMin: 1, rangeMax: 50, resolution: 0.002, travelMm: 50, notes: '' });
    // No audit history: only the travel (the last value a create wrote) survives; the notes say so.
    expect(await fields(seeded)).toMatchObject({ rangeMin: null, rangeMax: null, resolution: null, travelMm: 50, notes: expect.stringMatching(/may have been lost/) });
    expect(await fields(seededTransducer)).toMatchObject({ rangeMin: null, rangeMax: null, travelMm: null, notes: expect.stringMatching(/may have been lost/) });
    expect(await fields(sound)).toEqual({ rangeMin: 0, rangeMax: 10, resolution: 0.001, travelMm: 10, notes: '' });
  });

  it('does not trust a history that ends elsewhere than the column', () => {
    const created = { action: 'created', changes: { rangeMin: { from: null, to: 0 }, rangeMax: { from: null, to: 25 }, travelMm: { from: null, to: 25 } } };
    expect(recoverInstrumentFields([created], 25)).toEqual({ rangeMin: 0, rangeMax: 25, resolution: null, travelMm: 25 });
    expect(recoverInstrumentFields([created], 40)).toEqual({ rangeMin: undefined, rangeMax: undefined, resolution: undefined, travelMm: undefined });
  });
});
