/**
 * The demo accounts of the invented Tarnwick Field Sensors scenario (handbook product.md). Seeded by
 * `npm start` in its embedded mode only, into an empty database.
 */
import type { Role } from '../shared/api/auth.js';

/** The one demo password, printed by the start command and in the README. */
export const DEMO_PASSWORD = 'shelfmatch-demo';

/** One demo account per role. */
export const DEMO_ACCOUNTS: { email: string; name: string; role: Role }[] = [
  { email: 'admin@tarnwick.example', name: 'Ada Marsh', role: 'admin' },
  { email: 'designer@tarnwick.example', name: 'Dev Okafor', role: 'designer' },
  { email: 'stores@tarnwick.example', name: 'Sana Pike', role: 'stores' },
  { email: 'purchasing@tarnwick.example', name: 'Pat Lindqvist', role: 'purchasing' },
];
