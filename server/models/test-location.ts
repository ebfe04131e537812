import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type NonAttribute, type Sequelize } from 'sequelize';
import type { TestLocation as LocationDto } from '../../shared/schemas/projects';
import type { Project } from './project';

export class TestLocation extends Model<InferAttributes<TestLocation>, InferCreationAttributes<TestLocation>> {
  declare id: CreationOptional<number>;
  declare projectId: number;
  declare pitId: string;
  declare latitude: number | null;
  declare longitude: number | null;
  declare planX: number | null;
  declare planY: number | null;
  declare testDepthM: number;
  declare waterTableDepthM: number | null;
  declare pitWidthM: number | null;
  declare soilDescription: string;
  declare notes: string;
  declare sitePlanFile: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare project?: NonAttribute<Project>;

  toDto(): LocationDto {
    const { project: _p, createdAt, updatedAt, ...rest } = this.get({ plain: true }) as TestLocation;
    return { ...rest, sitePlanFile: this.sitePlanFile ?? null, createdAt: createdAt.toISOString(), updatedAt: updatedAt.toISOString() };
  }

  static initModel(sequelize: Sequelize) {
    const num = (allowNull: boolean) => ({ type: DataTypes.DOUBLE, allowNull });
    TestLocation.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        projectId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        pitId: { type: DataTypes.STRING(40), allowNull: false },
        latitude: num(true),
        longitude: num(true),
        planX: num(true),
        planY: num(true),
        testDepthM: num(false),
        waterTableDepthM: num(true),
        pitWidthM: num(true),
        soilDescription: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        sitePlanFile: { type: DataTypes.STRING(80), allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'test_locations' },
    );
  }
}
