import type { QueryInterface, Sequelize as SequelizeType } from 'sequelize';
import { DataTypes } from 'sequelize';
import { ROLES } from '../../../shared/schemas/users';

const id = { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true };
const timestamps = {
  created_at: { type: DataTypes.DATE(3), allowNull: false },
  updated_at: { type: DataTypes.DATE(3), allowNull: false },
};
const ref = (table: string, onDelete: 'CASCADE' | 'RESTRICT' | 'SET NULL' = 'RESTRICT', allowNull = false) => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete,
});

/** Foundation schema: accounts, sessions, sites and plans, instruments, runs, samples, audit. */
export async function up(qi: QueryInterface, _S: typeof SequelizeType): Promise<void> {
  await qi.createTable('organizations', {
    id,
    name: { type: DataTypes.STRING(160), allowNull: false, unique: true },
    contact_emails: { type: DataTypes.JSON, allowNull: false },
    ...timestamps,
  });
  await qi.createTable('users', {
    id,
    email: { type: DataTypes.STRING(190), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
    organization_id: ref('organizations', 'RESTRICT', true),
    password_hash: { type: DataTypes.STRING(255), allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    last_login_at: { type: DataTypes.DATE(3), allowNull: true },
    ...timestamps,
  });
  await qi.createTable('sessions', {
    sid: { type: DataTypes.STRING(36), primaryKey: true },
    expires: { type: DataTypes.DATE, allowNull: true },
    data: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('sessions', ['expires']);
  await qi.createTable('projects', {
    id,
    code: { type: DataTypes.STRING(40), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(160), allowNull: false },
    organization_id: ref('organizations'),
    site: { type: DataTypes.STRING(160), allowNull: false },
    address: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
    notes: { type: DataTypes.TEXT, allowNull: false },
    ...timestamps,
  });
  await qi.createTable('test_locations', {
    id,
    project_id: ref('projects', 'CASCADE'),
    pit_id: { type: DataTypes.STRING(40), allowNull: false },
    latitude: { type: DataTypes.DOUBLE, allowNull: true },
    longitude: { type: DataTypes.DOUBLE, allowNull: true },
    plan_x: { type: DataTypes.DOUBLE, allowNull: true },
    plan_y: { type: DataTypes.DOUBLE, allowNull: true },
    test_depth_m: { type: DataTypes.DOUBLE, allowNull: false },
    water_table_depth_m: { type: DataTypes.DOUBLE, allowNull: true },
    pit_width_m: { type: DataTypes.DOUBLE, allowNull: true },
    soil_description: { type: DataTypes.TEXT, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false },
    site_plan_file: { type: DataTypes.STRING(80), allowNull: true },
    ...timestamps,
  });
  await qi.addConstraint('test_locations', { type: 'unique', fields: ['project_id', 'pit_id'], name: 'test_locations_project_pit' });
  await qi.createTable('test_plans', {
    id,
    location_id: ref('test_locations', 'CASCADE'),
    name: { type: DataTypes.STRING(160), allowNull: false },
    procedure_id: { type: DataTypes.STRING(60), allowNull: false },
    settings: { type: DataTypes.JSON, allowNull: false },
    ...timestamps,
  });
  await qi.createTable('instruments', {
    id,
    kind: { type: DataTypes.ENUM('gauge', 'pressure', 'jack', 'load-cell'), allowNull: false },
    make_model: { type: DataTypes.STRING(120), allowNull: false },
    serial_number: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    range_min: { type: DataTypes.DOUBLE, allowNull: true },
    range_max: { type: DataTypes.DOUBLE, allowNull: true },
    unit: { type: DataTypes.STRING(16), allowNull: false },
    resolution: { type: DataTypes.DOUBLE, allowNull: true },
    travel_mm: { type: DataTypes.DOUBLE, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: false },
    ...timestamps,
  });
  await qi.createTable('calibrations', {
    id,
    instrument_id: ref('instruments', 'CASCADE'),
    calibrated_on: { type: DataTypes.DATEONLY, allowNull: false },
    due_on: { type: DataTypes.DATEONLY, allowNull: false },
    method: { type: DataTypes.JSON, allowNull: false },
    certificate_file: { type: DataTypes.STRING(80), allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: false },
    created_by: ref('users', 'RESTRICT', true),
    ...timestamps,
  });
  await qi.createTable('runs', {
    id,
    plan_id: ref('test_plans', 'RESTRICT'),
    status: { type: DataTypes.STRING(24), allowNull: false },
    state: { type: DataTypes.JSON, allowNull: false },
    started_at: { type: DataTypes.DATE(3), allowNull: true },
    finished_at: { type: DataTypes.DATE(3), allowNull: true },
    created_by: ref('users', 'RESTRICT', true),
    ...timestamps,
  });
  await qi.createTable('run_events', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    run_id: ref('runs', 'CASCADE'),
    at: { type: DataTypes.DATE(3), allowNull: false },
    kind: { type: DataTypes.STRING(40), allowNull: false },
    user_id: ref('users', 'RESTRICT', true),
    payload: { type: DataTypes.JSON, allowNull: false },
  });
  await qi.addIndex('run_events', ['run_id', 'at']);
  // Samples: millions of rows per run, written through the driver's batch(); integer columns keep
  // each batch a single bulk (values are integer micro-units: µm for gauges, Pa for pressure).
  await qi.sequelize.query(`CREATE TABLE samples (
      run_id INT UNSIGNED NOT NULL,
      seq BIGINT UNSIGNED NOT NULL,
      t_ms BIGINT NOT NULL,
      channel TINYINT UNSIGNED NOT NULL,
      raw INT NULL,
      value INT NULL,
      status TINYINT UNSIGNED NOT NULL DEFAULT 0,
      PRIMARY KEY (run_id, seq),
      KEY samples_run_time (run_id, t_ms)
    ) ENGINE=InnoDB`);
  await qi.createTable('audit_log', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    at: { type: DataTypes.DATE(3), allowNull: false },
    user_id: ref('users', 'RESTRICT', true),
    entity: { type: DataTypes.STRING(40), allowNull: false },
    entity_id: { type: DataTypes.STRING(40), allowNull: false },
    action: { type: DataTypes.STRING(40), allowNull: false },
    changes: { type: DataTypes.JSON, allowNull: false },
    reason: { type: DataTypes.STRING(500), allowNull: true },
  });
  await qi.addIndex('audit_log', ['entity', 'entity_id']);
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const t of ['audit_log', 'samples', 'run_events', 'runs', 'calibrations', 'instruments', 'test_plans', 'test_locations', 'projects', 'sessions', 'users', 'organizations']) {
    await qi.dropTable(t);
  }
}
