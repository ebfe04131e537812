import type { QueryInterface } from 'sequelize';
import { DataTypes } from 'sequelize';

const runRef = { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'runs', key: 'id' }, onDelete: 'CASCADE' } as const;

/**
 * Stored test records (the record of an imported run, kept whole so it is interpreted exactly as imported;
 * its own table keeps the large JSON out of the hot `runs` rows) and versioned interpretations of runs.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('run_records', {
    run_id: { ...runRef, primaryKey: true },
    source: { type: DataTypes.STRING(24), allowNull: false },
    record: { type: DataTypes.JSON, allowNull: false },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.createTable('interpretations', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    run_id: runRef,
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    options: { type: DataTypes.JSON, allowNull: false },
    result: { type: DataTypes.JSON, allowNull: false },
    chosen_method: { type: DataTypes.STRING(40), allowNull: true },
    reason: { type: DataTypes.STRING(500), allowNull: false },
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  // One row per version: two people saving at once cannot both get version n.
  await qi.addIndex('interpretations', ['run_id', 'version'], { unique: true });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('interpretations');
  await qi.dropTable('run_records');
}
