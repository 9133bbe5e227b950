/**
 * Loads seeds/demo-stock.csv (written by make-demo-stock.ts) through the same importer stores use,
 * so the demo stock passes every check a real upload does and shows in the import history, uploaded
 * by the demo stores account.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Sequelize } from 'sequelize';
import { User } from '../server/models/index.js';
import { importStockList } from '../server/services/stock/import-stock-list.js';

/** The demo stock file. */
export const DEMO_STOCK_FILE = join(import.meta.dirname, 'demo-stock.csv');

/** Imports the demo stock (merge mode); throws naming the first problems when the file is refused. */
export async function loadDemoStock(sequelize: Sequelize): Promise<void> {
  const uploader = await User.findOne({ where: { email: 'stores@tarnwick.example' } });
  const outcome = await importStockList(sequelize, {
    bytes: readFileSync(DEMO_STOCK_FILE),
    fileName: 'demo-stock.csv',
    mode: 'merge',
    dryRun: false,
    skipInvalid: false,
    userId: uploader?.id ?? null,
  });
  if (outcome.status !== 200) {
    const first = outcome.report.rejected.slice(0, 3).map((p) => `line ${p.line} ${p.column}: ${p.message}`);
    throw new Error(`seeds/demo-stock.csv was refused by the importer: ${first.join('; ')}`);
  }
}
