import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import type { TestRecord } from '../../shared/records/schema';
import { jsonColumn } from './json';

/** One saved interpretation of a run: the options used, the whole analysis, and the engineer's choice. Versions rise per run; rows are never changed. */
export class Interpretation extends Model<InferAttributes<Interpretation>, InferCreationAttributes<Interpretation>> {
  declare id: CreationOptional<number>;
  declare runId: number;
  declare version: number;
  declare options: Record<string, unknown>;
  declare result: Record<string, unknown>;
  declare chosenMethod: string | null;
  declare reason: string;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;

  toDto() {
    return {
      id: this.id,
      runId: this.runId,
      version: this.version,
      options: this.options,
      result: this.result,
      chosenMethod: this.chosenMethod,
      reason: this.reason,
      createdBy: this.createdBy,
      createdAt: this.createdAt.toISOString(),
    };
  }

  static initModel(sequelize: Sequelize) {
    Interpretation.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        options: jsonColumn('options'),
        result: jsonColumn('result'),
        chosenMethod: { type: DataTypes.STRING(40), allowNull: true },
        reason: { type: DataTypes.STRING(500), allowNull: false },
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'interpretations', updatedAt: false },
    );
  }
}

/** The test record a run carries as a whole (an imported run): interpreted exactly as it was imported. */
export class RunRecord extends Model<InferAttributes<RunRecord>, InferCreationAttributes<RunRecord>> {
  declare runId: number;
  declare source: 'import';
  declare record: TestRecord;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    RunRecord.init(
      {
        runId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
        source: { type: DataTypes.STRING(24), allowNull: false },
        record: jsonColumn('record'),
        createdAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'run_records', updatedAt: false },
    );
  }
}
