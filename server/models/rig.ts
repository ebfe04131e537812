import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import type { RigChannelInput, Rig as RigDto } from '../../shared/schemas/instruments';
import { jsonColumn } from './json';

export class Rig extends Model<InferAttributes<Rig>, InferCreationAttributes<Rig>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare mode: 'serial' | 'manual';
  declare channels: RigChannelInput[];
  declare jackInstrumentId: number | null;
  declare notes: string;
  declare simulator: RigDto['simulator'];
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  toDto(): RigDto {
    return {
      id: this.id,
      name: this.name,
      mode: this.mode,
      channels: this.channels,
      jackInstrumentId: this.jackInstrumentId,
      notes: this.notes,
      simulator: this.simulator ?? null,
      createdAt: this.createdAt.toISOString(),
      updatedAt: this.updatedAt.toISOString(),
    };
  }

  static initModel(sequelize: Sequelize) {
    Rig.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        name: { type: DataTypes.STRING(80), allowNull: false },
        mode: { type: DataTypes.STRING(16), allowNull: false },
        channels: jsonColumn('channels'),
        jackInstrumentId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        simulator: jsonColumn('simulator', true),
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'rigs' },
    );
  }
}
