import type { QueryInterface } from 'sequelize';
import { DataTypes } from 'sequelize';

/** Runs name the rig they read. */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('runs', 'rig_id', { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'rigs', key: 'id' }, onDelete: 'SET NULL' });
  await qi.addIndex('runs', ['status']);
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeIndex('runs', ['status']);
  await qi.removeColumn('runs', 'rig_id');
}
