import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type NonAttribute, type Sequelize } from 'sequelize';
import type { PlanInput, TestPlan as PlanDto } from '../../shared/schemas/plans';
import { jsonColumn } from './json';
import type { TestLocation } from './test-location';

/** Settings other than name and procedure live in one JSON column validated by `planInput`. */
export type PlanSettings = Omit<PlanInput, 'name' | 'procedureId'>;

/** Splits a validated plan into its columns. */
export function planColumns(input: PlanInput): { name: string; procedureId: string; settings: PlanSettings } {
  const { name, procedureId, ...settings } = input;
  return { name, procedureId, settings };
}

export class TestPlan extends Model<InferAttributes<TestPlan>, InferCreationAttributes<TestPlan>> {
  declare id: CreationOptional<number>;
  declare locationId: number;
  declare name: string;
  declare procedureId: string;
  declare settings: PlanSettings;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare location?: NonAttribute<TestLocation>;

  toInput(): PlanInput {
    return { name: this.name, procedureId: this.procedureId, ...this.settings };
  }

  toDto(): PlanDto {
    return {
      id: this.id,
      locationId: this.locationId,
      ...this.toInput(),
      createdAt: this.createdAt.toISOString(),
      updatedAt: this.updatedAt.toISOString(),
    };
  }

  static initModel(sequelize: Sequelize) {
    TestPlan.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        locationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        name: { type: DataTypes.STRING(160), allowNull: false },
        procedureId: { type: DataTypes.STRING(60), allowNull: false },
        settings: jsonColumn('settings'),
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'test_plans' },
    );
  }
}
