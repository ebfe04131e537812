import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import { jsonColumn } from './json';

/** One thing that happened in a run: who, when (run clock), what. Append-only. */
export class RunEvent extends Model<InferAttributes<RunEvent>, InferCreationAttributes<RunEvent>> {
  declare id: CreationOptional<number>;
  declare runId: number;
  declare at: Date;
  declare kind: string;
  declare userId: number | null;
  declare payload: Record<string, unknown>;

  toDto() {
    return { id: this.id, runId: this.runId, atMs: this.at.getTime(), kind: this.kind, userId: this.userId, payload: this.payload };
  }

  static initModel(sequelize: Sequelize) {
    RunEvent.init(
      {
        id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
        runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        at: { type: DataTypes.DATE(3), allowNull: false },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        payload: jsonColumn('payload'),
      },
      { sequelize, tableName: 'run_events', timestamps: false },
    );
  }
}
