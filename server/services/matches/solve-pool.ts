/**
 * Solves run on worker threads (piscina), one per core: snapping with combinations can take a
 * second or more of CPU, and on the event loop it would hold up every other request meanwhile
 * (sign-ins, health, stock pages) and let queued database requests time out. The thread runs
 * solve-worker.ts; TypeScript is loaded there as in the main thread, through tsx.
 */
import { createRequire } from 'node:module';
import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import type { SolveInput } from '../../../shared/engine/solve-request.js';
import { EngineInputError } from '../../../shared/engine/engine-input-error.js';
import type { SnapMatchOptions, SnappedSolveResponse, SnapSettings } from '../../../shared/snapping/snap-match.js';
import type { SnapPart } from '../../../shared/snapping/snap-part.js';
import solveHere, { type SolveOutcome, type SolveTask } from './solve-worker.js';

/** Threads by default: one per core the process may use. */
export const DEFAULT_SOLVE_THREADS = Math.max(1, availableParallelism());

/** Solve threads now (`SOLVE_THREADS`; 0 solves on the event loop, as a baseline for the load bench). */
let threads = DEFAULT_SOLVE_THREADS;
let pool: Piscina<SolveTask, SolveOutcome> | null = null;

/** Sets how many solve threads run (createApp, from the configuration); a running pool is ended. */
export function setSolveThreads(count: number): void {
  if (count === threads) return;
  threads = count;
  void closeSolvePool();
}

/** How many solve threads run (0: solves run on the event loop). */
export function solveThreads(): number {
  return threads;
}

/** The file URL of tsx's loader (its package's main export), or its bare name when that cannot be told. */
function tsxLoader(): string {
  try {
    return pathToFileURL(join(dirname(createRequire(import.meta.url).resolve('tsx/package.json')), 'dist', 'loader.mjs')).href;
  } catch {
    return 'tsx';
  }
}

function solvePool(): Piscina<SolveTask, SolveOutcome> {
  if (!pool) {
    const filename = new URL(`./solve-worker${import.meta.url.endsWith('.ts') ? '.ts' : '.js'}`, import.meta.url).href;
    pool = new Piscina({
      filename,
      // tsx by its own file, so the thread finds it whatever the working directory.
      execArgv: filename.endsWith('.ts') ? ['--import', tsxLoader()] : [],
      minThreads: 0,
      maxThreads: threads,
      // A thread idle this long ends (it keeps its stock indexes until then).
      idleTimeout: 60_000,
    });
  }
  return pool;
}

/**
 * Snaps `input` to the stock `parts` (read for `stockKey` with `fingerprint`) on a solve thread.
 * @throws EngineInputError when the engine refuses the request, as snapMatch would
 */
export async function snapOnThread(
  input: SolveInput,
  settings: SnapSettings,
  options: SnapMatchOptions,
  stock: { key: string; fingerprint: string; parts: SnapPart[] },
): Promise<SnappedSolveResponse> {
  const task: SolveTask = { input, settings, options, stockKey: stock.key, fingerprint: stock.fingerprint };
  if (threads === 0) return answerOf(solveHere({ ...task, parts: stock.parts }));
  let outcome = await solvePool().run(task);
  if (outcome.kind === 'need-stock') outcome = await solvePool().run({ ...task, parts: stock.parts });
  return answerOf(outcome);
}

function answerOf(outcome: SolveOutcome): SnappedSolveResponse {
  if (outcome.kind === 'input-error') {
    const [first] = outcome.details;
    throw new EngineInputError(first.field, first.value, outcome.message, outcome.details);
  }
  if (outcome.kind === 'need-stock') throw new Error('a solve thread asked for the stock it was just sent');
  return outcome.response;
}

/** Ends the solve threads (server shutdown); a later solve starts them again. */
export async function closeSolvePool(): Promise<void> {
  const ending = pool;
  pool = null;
  await ending?.destroy();
}
