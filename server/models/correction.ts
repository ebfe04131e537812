import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';

/** What a correction does to one archived reading. */
export const CORRECTION_ACTIONS = ['mark-faulty', 'correct-value'] as const;
export type CorrectionAction = (typeof CORRECTION_ACTIONS)[number];

/**
 * One audited correction of one archived sample: the sample row itself is never changed. Values are
 * micro-units like the samples (µm for gauges). Append-only; a later correction of the same sample supersedes an earlier one.
 */
export class SampleCorrection extends Model<InferAttributes<SampleCorrection>, InferCreationAttributes<SampleCorrection>> {
  declare id: CreationOptional<number>;
  declare runId: number;
  declare seq: number;
  declare channel: number;
  declare tMs: number;
  declare action: CorrectionAction;
  declare originalValue: number | null;
  declare newValue: number | null;
  declare reason: string;
  declare userId: number | null;
  declare userName: string;
  declare at: Date;

  toDto() {
    return {
      id: Number(this.id),
      runId: this.runId,
      seq: Number(this.seq),
      channel: this.channel,
      tMs: Number(this.tMs),
      action: this.action,
      originalValue: this.originalValue,
      newValue: this.newValue,
      reason: this.reason,
      userId: this.userId,
      userName: this.userName,
      at: this.at.toISOString(),
    };
  }

  static initModel(sequelize: Sequelize) {
    SampleCorrection.init(
      {
        id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
        runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        seq: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
        channel: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
        tMs: { type: DataTypes.BIGINT, allowNull: false },
        action: { type: DataTypes.STRING(20), allowNull: false },
        originalValue: { type: DataTypes.INTEGER, allowNull: true },
        newValue: { type: DataTypes.INTEGER, allowNull: true },
        reason: { type: DataTypes.STRING(500), allowNull: false },
        userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        userName: { type: DataTypes.STRING(160), allowNull: false },
        at: { type: DataTypes.DATE(3), allowNull: false },
      },
      { sequelize, tableName: 'sample_corrections', timestamps: false },
    );
  }
}

/** The value each corrected sample now has, by seq: a number (micro-units) or null for a reading marked faulty. Later corrections win. */
export async function correctedValues(runId: number): Promise<Map<number, number | null>> {
  const rows = await SampleCorrection.findAll({ where: { runId }, order: [['id', 'ASC']] });
  return new Map(rows.map((c) => [Number(c.seq), c.action === 'mark-faulty' ? null : c.newValue]));
}
