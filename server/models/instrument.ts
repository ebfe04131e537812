import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type NonAttribute, type Sequelize } from 'sequelize';
import { calibrationStatus, todayUtc } from '../../shared/instruments/status';
import { INSTRUMENT_KINDS, type Instrument as InstrumentDto, type InstrumentKind } from '../../shared/schemas/instruments';
import type { CalibrationRecord } from './calibration-record';

export class Instrument extends Model<InferAttributes<Instrument>, InferCreationAttributes<Instrument>> {
  declare id: CreationOptional<number>;
  declare kind: InstrumentKind;
  declare makeModel: string;
  declare serialNumber: string;
  declare rangeMin: number | null;
  declare rangeMax: number | null;
  declare unit: string;
  declare resolution: number | null;
  declare travelMm: number | null;
  declare ratedPressureMpa: number | null;
  declare notes: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare calibrations?: NonAttribute<CalibrationRecord[]>;

  /** The calibration in force: the latest by calibration date (needs `calibrations` loaded). */
  currentCalibration(): CalibrationRecord | null {
    const list = this.calibrations ?? [];
    return list.reduce<CalibrationRecord | null>((best, c) => (!best || c.calibratedOn > best.calibratedOn || (c.calibratedOn === best.calibratedOn && c.id > best.id) ? c : best), null);
  }

  toDto(today = todayUtc()): InstrumentDto {
    const current = this.currentCalibration();
    return {
      id: this.id,
      kind: this.kind,
      makeModel: this.makeModel,
      serialNumber: this.serialNumber,
      rangeMin: this.rangeMin,
      rangeMax: this.rangeMax,
      unit: this.unit,
      resolution: this.resolution,
      travelMm: this.travelMm,
      ratedPressureMpa: this.ratedPressureMpa ?? null,
      notes: this.notes,
      status: calibrationStatus(current?.dueOn, today),
      current: current?.toDto() ?? null,
      createdAt: this.createdAt.toISOString(),
      updatedAt: this.updatedAt.toISOString(),
    };
  }

  static initModel(sequelize: Sequelize) {
    // A fresh object per attribute: Sequelize writes each attribute's column name into its object, so a
    // shared one would map every attribute to the first one's column (migration 0009 repairs that).
    const num = () => ({ type: DataTypes.DOUBLE, allowNull: true });
    Instrument.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        kind: { type: DataTypes.ENUM(...INSTRUMENT_KINDS), allowNull: false },
        makeModel: { type: DataTypes.STRING(120), allowNull: false },
        serialNumber: { type: DataTypes.STRING(80), allowNull: false },
        rangeMin: num(),
        rangeMax: num(),
        unit: { type: DataTypes.STRING(16), allowNull: false },
        resolution: num(),
        travelMm: num(),
        ratedPressureMpa: num(),
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'instruments' },
    );
  }
}
