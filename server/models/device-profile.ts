import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type Sequelize } from 'sequelize';
import type { DeviceProfile, ListedDeviceProfile } from '../../shared/devices/schema';
import { jsonColumn } from './json';

/** A device profile the lab defined: its id (what rig channels name) and the whole profile as checked by the shared schema. */
export class DeviceProfileRecord extends Model<InferAttributes<DeviceProfileRecord>, InferCreationAttributes<DeviceProfileRecord>> {
  declare profileId: string;
  declare protocol: DeviceProfile['protocol'];
  declare definition: DeviceProfile;
  declare createdBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  toProfile(): DeviceProfile {
    return { ...this.definition, id: this.profileId };
  }

  toDto(): ListedDeviceProfile {
    return { ...this.toProfile(), source: 'lab', updatedAt: this.updatedAt.toISOString() };
  }

  static initModel(sequelize: Sequelize) {
    DeviceProfileRecord.init(
      {
        profileId: { type: DataTypes.STRING(60), primaryKey: true },
        protocol: { type: DataTypes.STRING(16), allowNull: false },
        definition: jsonColumn('definition'),
        createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'device_profiles' },
    );
  }
}
