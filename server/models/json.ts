import { DataTypes } from 'sequelize';

/**
 * A JSON column that reads back as an object. MariaDB stores JSON as LONGTEXT, and the connector
 * may hand it back as a string, so the getter parses when needed.
 */
export function jsonColumn(field: string, allowNull = false) {
  return {
    type: DataTypes.JSON,
    allowNull,
    get(this: { getDataValue(k: string): unknown }) {
      const v = this.getDataValue(field);
      return typeof v === 'string' ? JSON.parse(v) : v;
    },
  };
}
