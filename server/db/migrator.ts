import { type QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import * as initial from './migrations/0001-initial';
import * as rigs from './migrations/0002-rigs';
import * as runRig from './migrations/0003-run-rig';
import * as interpretations from './migrations/0004-interpretations';
import * as signoff from './migrations/0005-signoff';
import * as corrections from './migrations/0006-corrections';
import * as rollups from './migrations/0007-sample-rollups';
import * as photos from './migrations/0008-photos';
import * as instrumentFields from './migrations/0009-instrument-fields';
import * as signedReports from './migrations/0010-signed-reports';
import * as jackRatedPressure from './migrations/0011-jack-rated-pressure';
import * as deviceProfiles from './migrations/0012-device-profiles';

export interface Migration {
  up(qi: QueryInterface, S: typeof Sequelize): Promise<void>;
  down(qi: QueryInterface, S: typeof Sequelize): Promise<void>;
}

/** Ordered list of migrations; add new files here. Names are stored in `schema_migrations`. */
const MIGRATIONS: [string, Migration][] = [
  ['0001-initial', initial],
  ['0002-rigs', rigs],
  ['0003-run-rig', runRig],
  ['0004-interpretations', interpretations],
  ['0005-signoff', signoff],
  ['0006-corrections', corrections],
  ['0007-sample-rollups', rollups],
  ['0008-photos', photos],
  ['0009-instrument-fields', instrumentFields],
  ['0010-signed-reports', signedReports],
  ['0011-jack-rated-pressure', jackRatedPressure],
  ['0012-device-profiles', deviceProfiles],
];

export function createMigrator(sequelize: Sequelize) {
  return new Umzug({
    migrations: MIGRATIONS.map(([name, m]) => ({
      name,
      up: () => m.up(sequelize.getQueryInterface(), Sequelize),
      down: () => m.down(sequelize.getQueryInterface(), Sequelize),
    })),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const done = await createMigrator(sequelize).up();
  return done.map((m) => m.name);
}
