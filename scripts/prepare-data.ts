/**
 * What `npm start` puts in the database after migrating. Embedded mode: the demo scenario, into a
 * database that has no users yet (or one this seeder filled before, so newer seeds still apply).
 * External mode (DATABASE_URL): never demo data; the first admin from ADMIN_EMAIL / ADMIN_PASSWORD.
 */
import type { Sequelize } from 'sequelize';
import { QueryTypes } from 'sequelize';
import { User } from '../server/models/index.js';
import { createUser } from '../server/services/users/manage-users.js';
import { seedDemoData } from '../seeds/index.js';
import { DEMO_ACCOUNTS } from '../seeds/demo-accounts.js';

/** Seeds or creates the first admin; returns the demo accounts to print (none in external mode). */
export async function prepareData(sequelize: Sequelize, options: { embedded: boolean }): Promise<typeof DEMO_ACCOUNTS> {
  const users = await User.count();
  if (options.embedded) {
    const [{ seeded }] = await sequelize.query<{ seeded: boolean }>("SELECT to_regclass('seed_runs') IS NOT NULL AS seeded", { type: QueryTypes.SELECT });
    if (users === 0 || seeded) {
      const ran = await seedDemoData(sequelize);
      if (ran.length) console.log(`Seeded demo data: ${ran.join(', ')}`);
    }
    return DEMO_ACCOUNTS;
  }
  if (users === 0) {
    const email = process.env.ADMIN_EMAIL;
    const password = process.env.ADMIN_PASSWORD;
    if (!email || !password) {
      console.warn('The database has no users: set ADMIN_EMAIL and ADMIN_PASSWORD (10+ characters) to create the first admin.');
    } else {
      await createUser(sequelize, null, { email, name: 'Administrator', role: 'admin', password });
      console.log(`Created the first admin, ${email}.`);
    }
  }
  return [];
}
