import type { QueryInterface } from 'sequelize';
import { DataTypes } from 'sequelize';

/**
 * The sealed report of each signature: everything the report showed at signing as canonical JSON (its
 * SHA-256 is the signature's hash), and the PDF rendered from it at that moment with its SHA-256. Rows
 * are written once, with the signature, and never changed.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('signed_reports', {
    signature_id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true, references: { model: 'signatures', key: 'id' }, onDelete: 'RESTRICT' },
    run_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'runs', key: 'id' }, onDelete: 'RESTRICT' },
    snapshot: { type: 'LONGTEXT', allowNull: false },
    snapshot_hash: { type: DataTypes.CHAR(64), allowNull: false },
    pdf: { type: 'LONGBLOB', allowNull: false },
    pdf_hash: { type: DataTypes.CHAR(64), allowNull: false },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex('signed_reports', ['run_id']);
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('signed_reports');
}
