/**
 * The demo scenario's work in progress (product.md "Demo scenario"), so every screen of a fresh
 * `npm start` has something in it: Dev Okafor (the demo designer) has saved a match for each radio
 * link of Tarnwick's sensor nodes, and planned two builds with them. The first is covered by the
 * demo stock; the second asks for more than the shelf holds, so a shortfall list waits for
 * purchasing. Everything goes through the same services the API uses (solve, save, plan and
 * reserve), so the seed holds to every rule a real user's work does. The impedances are invented.
 */
import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import type { Sequelize } from 'sequelize';
import type { SolveRequest } from '../shared/api/matches.js';
import { User } from '../server/models/index.js';
import { createBuild } from '../server/services/builds/create-build.js';
import { readMatchPlans } from '../server/services/builds/read-match-plans.js';
import { saveMatch } from '../server/services/matches/save-match.js';
import { solveMatch } from '../server/services/matches/solve-match.js';
import { DEMO_ANTENNA_FILE } from './make-demo-antenna.js';

/** The demo designer, who owns the demo work. */
const DEMO_DESIGNER_EMAIL = 'designer@tarnwick.example';

const antenna = (): SolveRequest['loadTouchstone'] => ({ fileName: basename(DEMO_ANTENNA_FILE), text: readFileSync(DEMO_ANTENNA_FILE, 'utf8') });

/** One saved match per link on Tarnwick's boards: name and request (invented loads). */
export const DEMO_MATCHES: readonly { name: string; request: SolveRequest }[] = [
  { name: 'Soil node 868 MHz chip antenna (measured)', request: { source: 50, loadTouchstone: antenna(), frequencyHz: '868MHz', bandwidthHz: '2MHz' } },
  { name: 'Soil node 915 MHz chip antenna (measured)', request: { source: 50, loadTouchstone: antenna(), frequencyHz: '915MHz', bandwidthHz: '26MHz' } },
  { name: 'Weather node 2.45 GHz short-range link', request: { source: 50, load: '28-j16', frequencyHz: '2.45GHz', bandwidthHz: '80MHz' } },
  { name: 'Reader board 13.56 MHz tag coil', request: { source: 50, load: '1.8+j96', frequencyHz: '13.56MHz', powerW: 0.2 } },
  { name: 'Gateway 40.68 MHz telemetry link', request: { source: 50, load: '210-j65', frequencyHz: '40.68MHz', powerW: 0.5 } },
];

/** The two demo builds: which matches (by index above) one board carries, and how many boards. */
export const DEMO_BUILDS: readonly { name: string; matches: readonly number[]; quantity: number }[] = [
  { name: 'Soil node rev B, pilot run', matches: [0, 2], quantity: 20 },
  { name: 'Reader board and gateway, first batch', matches: [3, 4], quantity: 150 },
];

/**
 * Saves the demo matches (each with the fit that loses least at the worst tolerance corner) and plans and
 * reserves the demo builds. Throws, naming the match, when the demo stock gives a link no fit.
 */
export async function loadDemoWork(sequelize: Sequelize): Promise<void> {
  const designer = await User.findOne({ where: { email: DEMO_DESIGNER_EMAIL } });
  if (!designer) throw new Error(`The demo work needs the demo designer ${DEMO_DESIGNER_EMAIL}; seed the demo accounts first.`);
  const ids: number[] = [];
  for (const { name, request } of DEMO_MATCHES) {
    const { response } = await solveMatch(sequelize, request);
    // As a designer would: the network whose best fit loses least at the worst tolerance corner.
    const best = response.networks
      .filter((n) => n.fits.length > 0)
      .sort((a, b) => a.fits[0].loss.worstCaseDb - b.fits[0].loss.worstCaseDb)[0];
    if (!best) throw new Error(`The demo stock gives no stocked fit for the demo match "${name}".`);
    const saved = await saveMatch(sequelize, designer.id, { name, request, chosen: { placement: best.placement, solution: best.solution, rank: best.fits[0].rank } });
    ids.push(saved.id);
  }
  for (const build of DEMO_BUILDS) {
    const plans = await readMatchPlans(build.matches.map((i) => ids[i]));
    await createBuild(sequelize, { name: build.name, quantity: build.quantity, reserve: true, plans }, designer.id);
  }
}
