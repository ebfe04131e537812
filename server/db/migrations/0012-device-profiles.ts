import type { QueryInterface } from 'sequelize';
import { DataTypes } from 'sequelize';

/** Device profiles the lab defines (protocol, register or pattern, serial settings), beside the built-in ones. */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('device_profiles', {
    profile_id: { type: DataTypes.STRING(60), primaryKey: true },
    protocol: { type: DataTypes.STRING(16), allowNull: false },
    definition: { type: DataTypes.JSON, allowNull: false },
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('device_profiles');
}
