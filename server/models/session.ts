import { DataTypes, type Sequelize } from 'sequelize';

/** Session rows for connect-session-sequelize; the table itself comes from the migrations. */
export function defineSessionModel(sequelize: Sequelize) {
  return sequelize.define(
    'Session',
    {
      sid: { type: DataTypes.STRING(36), primaryKey: true },
      expires: DataTypes.DATE,
      data: DataTypes.TEXT,
    },
    { tableName: 'sessions' },
  );
}
