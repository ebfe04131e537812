import type { QueryInterface } from 'sequelize';
import { DataTypes } from 'sequelize';

/**
 * Corrections of archived readings: one append-only row per correction, beside the samples table
 * (which is never updated), keeping who, when, why, the original value and the new one.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('sample_corrections', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    run_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'runs', key: 'id' }, onDelete: 'CASCADE' },
    seq: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
    channel: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
    t_ms: { type: DataTypes.BIGINT, allowNull: false },
    action: { type: DataTypes.STRING(20), allowNull: false },
    original_value: { type: DataTypes.INTEGER, allowNull: true },
    new_value: { type: DataTypes.INTEGER, allowNull: true },
    reason: { type: DataTypes.STRING(500), allowNull: false },
    user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    user_name: { type: DataTypes.STRING(160), allowNull: false },
    at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex('sample_corrections', ['run_id', 'seq']);
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('sample_corrections');
}
