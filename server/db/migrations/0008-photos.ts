import type { QueryInterface } from 'sequelize';
import { DataTypes } from 'sequelize';

/**
 * Site and pit photos: one row per uploaded image of a test location, optionally of one of its runs.
 * The files (the upload as it came and two renditions) live under `<dataDir>/uploads/photos`, named by
 * `file_key`; the row keeps the upload's SHA-256 so the report can print it beside the photo.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('photos', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    location_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'test_locations', key: 'id' }, onDelete: 'RESTRICT' },
    run_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'runs', key: 'id' }, onDelete: 'RESTRICT' },
    kind: { type: DataTypes.STRING(10), allowNull: false },
    caption: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
    file_key: { type: DataTypes.STRING(40), allowNull: false, unique: true },
    original_ext: { type: DataTypes.STRING(8), allowNull: false },
    mime: { type: DataTypes.STRING(40), allowNull: false },
    bytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    sha256: { type: DataTypes.CHAR(64), allowNull: false },
    uploaded_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex('photos', ['location_id', 'created_at']);
  await qi.addIndex('photos', ['run_id']);
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('photos');
}
