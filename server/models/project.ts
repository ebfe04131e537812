import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type NonAttribute, type Sequelize } from 'sequelize';
import type { Project as ProjectDto } from '../../shared/schemas/projects';
import type { Organization } from './organization';

export class Project extends Model<InferAttributes<Project>, InferCreationAttributes<Project>> {
  declare id: CreationOptional<number>;
  declare code: string;
  declare name: string;
  declare organizationId: number;
  declare site: string;
  declare address: string;
  declare notes: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare organization?: NonAttribute<Organization>;

  toDto(): ProjectDto {
    return {
      id: this.id,
      code: this.code,
      name: this.name,
      organizationId: this.organizationId,
      organizationName: this.organization?.name ?? '',
      site: this.site,
      address: this.address,
      notes: this.notes,
      createdAt: this.createdAt.toISOString(),
      updatedAt: this.updatedAt.toISOString(),
    };
  }

  static initModel(sequelize: Sequelize) {
    Project.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        code: { type: DataTypes.STRING(40), allowNull: false },
        name: { type: DataTypes.STRING(160), allowNull: false },
        organizationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        site: { type: DataTypes.STRING(160), allowNull: false },
        address: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'projects' },
    );
  }
}
