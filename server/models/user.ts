import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import { ROLES, type Role, type User as UserDto } from '../../shared/schemas/users';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare organizationId: number | null;
  declare passwordHash: string;
  declare active: CreationOptional<boolean>;
  declare lastLoginAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** The outward view: never the hash. */
  toDto(): UserDto {
    return {
      id: this.id,
      email: this.email,
      name: this.name,
      role: this.role,
      organizationId: this.organizationId,
      active: this.active,
      createdAt: this.createdAt.toISOString(),
    };
  }

  static initModel(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        email: { type: DataTypes.STRING(190), allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
        organizationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        passwordHash: { type: DataTypes.STRING(255), allowNull: false },
        active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        lastLoginAt: { type: DataTypes.DATE(3), allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'users' },
    );
  }
}
