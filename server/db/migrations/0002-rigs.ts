import type { QueryInterface } from 'sequelize';
import { DataTypes } from 'sequelize';

/** Rigs: named sets of channels (instrument, port, device profile), and the jack they use. */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('rigs', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    name: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    mode: { type: DataTypes.STRING(16), allowNull: false },
    channels: { type: DataTypes.JSON, allowNull: false },
    jack_instrument_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'instruments', key: 'id' }, onDelete: 'SET NULL' },
    notes: { type: DataTypes.TEXT, allowNull: false },
    simulator: { type: DataTypes.JSON, allowNull: true },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('rigs');
}
