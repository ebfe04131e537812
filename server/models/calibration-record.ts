import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import type { Calibration } from '../../shared/calibration/schema';
import type { CalibrationRecord as CalibrationDto } from '../../shared/schemas/instruments';
import { jsonColumn } from './json';

/** One calibration certificate of an instrument (table `calibrations`). */
export class CalibrationRecord extends Model<InferAttributes<CalibrationRecord>, InferCreationAttributes<CalibrationRecord>> {
  declare id: CreationOptional<number>;
  declare instrumentId: number;
  declare calibratedOn: string;
  declare dueOn: string;
  declare method: Calibration;
  declare certificateFile: CreationOptional<string | null>;
  declare notes: string;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  toDto(): CalibrationDto {
    return {
      id: this.id,
      instrumentId: this.instrumentId,
      calibratedOn: this.calibratedOn,
      dueOn: this.dueOn,
      method: this.method,
      notes: this.notes,
      certificateFile: this.certificateFile ?? null,
      createdBy: this.createdBy,
      createdAt: this.createdAt.toISOString(),
    };
  }

  static initModel(sequelize: Sequelize) {
    CalibrationRecord.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        instrumentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        calibratedOn: { type: DataTypes.DATEONLY, allowNull: false },
        dueOn: { type: DataTypes.DATEONLY, allowNull: false },
        method: jsonColumn('method'),
        certificateFile: { type: DataTypes.STRING(80), allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'calibrations' },
    );
  }
}
