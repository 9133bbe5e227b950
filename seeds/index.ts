/**
 * The demo-data seeder. It has its own meta table (`seed_runs`), apart from the migrations, so a
 * seed runs once per database; `npm start` runs it only in its embedded mode and only when the
 * database has no users yet.
 */
import { Umzug, SequelizeStorage } from 'umzug';
import type { Sequelize } from 'sequelize';
import { User } from '../server/models/index.js';
import { hashPassword } from '../server/services/users/password.js';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from './demo-accounts.js';
import { loadDemoStock } from './load-demo-stock.js';
import { loadDemoWork } from './demo-work.js';

interface Seed {
  name: string;
  run(sequelize: Sequelize): Promise<void>;
}

const SEEDS: Seed[] = [
  {
    name: '0001-demo-accounts',
    async run(sequelize) {
      const passwordHash = await hashPassword(DEMO_PASSWORD);
      await sequelize.transaction(async (transaction) => {
        for (const account of DEMO_ACCOUNTS) {
          await User.findOrCreate({ where: { email: account.email }, defaults: { ...account, passwordHash }, transaction });
        }
      });
    },
  },
  { name: '0002-demo-stock', run: loadDemoStock },
  { name: '0003-demo-work', run: loadDemoWork },
];

/** Runs every seed not yet recorded in `seed_runs`; returns the names run. */
export async function seedDemoData(sequelize: Sequelize): Promise<string[]> {
  const umzug = new Umzug<Sequelize>({
    migrations: SEEDS.map((seed) => ({ name: seed.name, up: ({ context }: { context: Sequelize }) => seed.run(context) })),
    context: sequelize,
    storage: new SequelizeStorage({ sequelize, tableName: 'seed_runs' }),
    logger: undefined,
  });
  return (await umzug.up()).map((m) => m.name);
}
