import { Umzug, SequelizeStorage } from 'umzug';
import type { Sequelize } from 'sequelize';
import { migrations } from '../migrations';
import type { Logger } from '../logger';

/** Brings the schema up to date; safe to run at every start. */
export async function migrate(sequelize: Sequelize, logger?: Logger): Promise<string[]> {
  const umzug = new Umzug({
    migrations: migrations.map((m) => ({ name: m.name, up: m.up, down: m.down })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
  const done = await umzug.up();
  if (done.length && logger) logger.info({ migrations: done.map((d) => d.name) }, 'migrated');
  return done.map((d) => d.name);
}
