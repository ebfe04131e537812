import { Sequelize } from 'sequelize';
import type { ServerConfig } from '../config';

/** One Sequelize instance over the `mariadb` connector. Samples later borrow its pool for `batch()`. */
export function createSequelize(db: ServerConfig['db'], poolMax = 10): Sequelize {
  return new Sequelize(db.database, db.user, db.password, {
    dialect: 'mariadb',
    host: db.host,
    port: db.port,
    logging: false,
    timezone: '+00:00',
    pool: { max: poolMax, min: 0, idle: 10_000, acquire: 20_000 },
    dialectOptions: { bigIntAsNumber: true, insertIdAsNumber: true, decimalAsNumber: true, connectTimeout: 5000 },
    define: { underscored: true },
  });
}
