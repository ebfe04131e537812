import type { QueryInterface } from 'sequelize';
import { DataTypes } from 'sequelize';

const runRef = { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'runs', key: 'id' }, onDelete: 'CASCADE' } as const;
const userRef = { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' } as const;

/**
 * Review and sign-off of runs (one row per run, its signatures kept for every revision) and the
 * messages the local mail catcher received.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.createTable('signoffs', {
    run_id: { ...runRef, primaryKey: true },
    state: { type: DataTypes.STRING(24), allowNull: false },
    revision: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    interpretation_version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    submitted_by: userRef,
    submitted_at: { type: DataTypes.DATE(3), allowNull: true },
    revisions: { type: DataTypes.JSON, allowNull: false },
    created_at: { type: DataTypes.DATE(3), allowNull: false },
    updated_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.createTable('signatures', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    run_id: runRef,
    revision: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    interpretation_version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    user_id: userRef,
    signer_name: { type: DataTypes.STRING(160), allowNull: false },
    meaning: { type: DataTypes.STRING(24), allowNull: false },
    data_hash: { type: DataTypes.CHAR(64), allowNull: false },
    signed_at: { type: DataTypes.DATE(3), allowNull: false },
  });
  await qi.addIndex('signatures', ['run_id', 'revision']);
  await qi.createTable('mail_messages', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    received_at: { type: DataTypes.DATE(3), allowNull: false },
    envelope_from: { type: DataTypes.STRING(320), allowNull: false },
    envelope_to: { type: DataTypes.JSON, allowNull: false },
    subject: { type: DataTypes.STRING(500), allowNull: false },
    text: { type: DataTypes.TEXT, allowNull: false },
    attachments: { type: DataTypes.JSON, allowNull: false },
    size_bytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('mail_messages');
  await qi.dropTable('signatures');
  await qi.dropTable('signoffs');
}
