import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import type { Organization as OrganizationDto } from '../../shared/schemas/users';
import { jsonColumn } from './json';

export class Organization extends Model<InferAttributes<Organization>, InferCreationAttributes<Organization>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare contactEmails: string[];
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  toDto(): OrganizationDto {
    return { id: this.id, name: this.name, contactEmails: this.contactEmails, createdAt: this.createdAt.toISOString() };
  }

  static initModel(sequelize: Sequelize) {
    Organization.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        name: { type: DataTypes.STRING(160), allowNull: false },
        contactEmails: jsonColumn('contactEmails'),
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'organizations' },
    );
  }
}
