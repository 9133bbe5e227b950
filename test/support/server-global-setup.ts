/** vitest global setup of the server suite: one migrated template database per run. */
import { createTemplate } from './test-database.js';

export default async function setup(): Promise<void> {
  await createTemplate();
}
