/**
 * The migration list, in order. umzug records applied names in `schema_migrations`; a migration is
 * never edited after it ran: add a new one instead. Seeds have their own table (see seeds/).
 */
import { Umzug, SequelizeStorage } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';
import * as usersAndAudit from './20261202-0001-users-and-audit.js';
import * as stock from './20261202-0002-stock.js';
import * as stockBulkKeys from './20261202-0002-stock-bulk-keys.js';
import * as mailAndUserTokens from './20261202-0003-mail-and-user-tokens.js';
import * as matchesAndSettings from './20261202-0004-matches-and-settings.js';
import * as buildsAndShortfall from './20261202-0005-builds-and-shortfall.js';
import * as stockImportWriteKeys from './20261202-0006-stock-import-write-keys.js';
import * as stockVersions from './20261202-0007-stock-versions.js';

interface MigrationModule {
  up(params: { context: QueryInterface }): Promise<void>;
  down(params: { context: QueryInterface }): Promise<void>;
}

const MIGRATIONS: { name: string; module: MigrationModule }[] = [
  { name: '20261202-0001-users-and-audit', module: usersAndAudit },
  { name: '20261202-0002-stock', module: stock },
  { name: '20261202-0003-mail-and-user-tokens', module: mailAndUserTokens },
  { name: '20261202-0004-matches-and-settings', module: matchesAndSettings },
  { name: '20261202-0005-builds-and-shortfall', module: buildsAndShortfall },
  { name: '20261202-0002-stock-bulk-keys', module: stockBulkKeys },
  { name: '20261202-0006-stock-import-write-keys', module: stockImportWriteKeys },
  { name: '20261202-0007-stock-versions', module: stockVersions },
];

/** Builds the migrator for `sequelize`. */
export function migrator(sequelize: Sequelize) {
  return new Umzug<QueryInterface>({
    migrations: MIGRATIONS.map(({ name, module }) => ({
      name,
      up: ({ context }: { context: QueryInterface }) => module.up({ context }),
      down: ({ context }: { context: QueryInterface }) => module.down({ context }),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

/** Applies every pending migration; returns the names applied. */
export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const done = await migrator(sequelize).up();
  return done.map((m) => m.name);
}
