import type { QueryInterface } from 'sequelize';
import { DataTypes } from 'sequelize';

/**
 * A jack's rated (maximum working) pressure, MPa: the console never prompts beyond it. Jacks registered
 * before have none (NULL) until someone enters it from the jack's plate or certificate; the register asks
 * for it at the next change.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('instruments', 'rated_pressure_mpa', { type: DataTypes.DOUBLE, allowNull: true });
}

export async function down(qi: QueryInterface): Promise<void> {
  // Plain SQL: the query interface's removeColumn fails on MariaDB in this Sequelize version.
  await qi.sequelize.query('ALTER TABLE instruments DROP COLUMN rated_pressure_mpa');
}
