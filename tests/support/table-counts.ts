import { QueryTypes, type Sequelize } from 'sequelize';

/** Row counts of the named tables, to show that a refused write stored nothing. */
export async function tableCounts(sequelize: Sequelize, tables: readonly string[]): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const table of tables) {
    const [row] = (await sequelize.query(`SELECT COUNT(*) AS n FROM ${table}`, { type: QueryTypes.SELECT })) as { n: number }[];
    out[table] = Number(row.n);
  }
  return out;
}
