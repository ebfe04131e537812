import type { QueryInterface } from 'sequelize';
import { DataTypes, QueryTypes } from 'sequelize';

/** Runs name the rig they read. */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('runs', 'rig_id', { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'rigs', key: 'id' }, onDelete: 'SET NULL' });
  await qi.addIndex('runs', ['status']);
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeIndex('runs', ['status']);
  // removeColumn's own foreign-key lookup trips over the mariadb connector (a raw SELECT without a
  // type), so the constraint is found and dropped here first.
  const fks = (await qi.sequelize.query(
    "SELECT CONSTRAINT_NAME AS name FROM information_schema.KEY_COLUMN_USAGE WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME = 'runs' AND COLUMN_NAME = 'rig_id' AND REFERENCED_TABLE_NAME IS NOT NULL",
    { type: QueryTypes.SELECT },
  )) as { name: string }[];
  for (const { name } of fks) await qi.sequelize.query(`ALTER TABLE runs DROP FOREIGN KEY \`${name}\``);
  await qi.sequelize.query('ALTER TABLE runs DROP COLUMN rig_id');
}
