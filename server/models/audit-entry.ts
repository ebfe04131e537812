import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import { jsonColumn } from './json';

/** One audited change: who, when (UTC), what, old → new, why. Append-only. */
export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<number>;
  declare at: Date;
  declare userId: number | null;
  declare entity: string;
  declare entityId: string;
  declare action: string;
  declare changes: Record<string, { from: unknown; to: unknown }> | Record<string, unknown>;
  declare reason: string | null;

  static initModel(sequelize: Sequelize) {
    AuditEntry.init(
      {
        id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
        at: { type: DataTypes.DATE(3), allowNull: false },
        userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        entity: { type: DataTypes.STRING(40), allowNull: false },
        entityId: { type: DataTypes.STRING(40), allowNull: false },
        action: { type: DataTypes.STRING(40), allowNull: false },
        changes: jsonColumn('changes'),
        reason: { type: DataTypes.STRING(500), allowNull: true },
      },
      { sequelize, tableName: 'audit_log', timestamps: false },
    );
  }
}
