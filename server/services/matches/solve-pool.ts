/**
 * Solves run on worker threads (piscina), one per core: snapping with combinations can take a
 * second or more of CPU, and on the event loop it would hold up every other request meanwhile
 * (sign-ins, health, stock pages) and let queued database requests time out. The thread runs
 * solve-worker.ts, bundled to plain JavaScript ({@link workerModule}).
 *
 * Two lanes, each a pool of its own: single-part solves (tens of milliseconds) and searches with
 * two-part combinations (up to a second or so). In one queue, a quick question asked while a
 * colleague's combination searches fill every thread waited for them to finish; in its own lane it
 * starts at once and shares the cores with them (the load bench's "single-part solves beside
 * combinations" shows it). Each lane may run as many threads as `SOLVE_THREADS`, so either kind
 * alone still has every core.
 */
import { createHash } from 'node:crypto';
import { existsSync, renameSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { buildSync } from 'esbuild';
import { Piscina } from 'piscina';
import type { SolveInput } from '../../../shared/engine/solve-request.js';
import { EngineInputError } from '../../../shared/engine/engine-input-error.js';
import type { SnapMatchOptions, SnappedSolveResponse, SnapSettings } from '../../../shared/snapping/snap-match.js';
import type { SnapPart } from '../../../shared/snapping/snap-part.js';
import solveHere, { type SolveOutcome, type SolveTask } from './solve-worker.js';

/** Threads by default: one per core the process may use. */
export const DEFAULT_SOLVE_THREADS = Math.max(1, availableParallelism());

/** The two kinds of solve, each with threads of its own. */
export type SolveLane = 'single' | 'combinations';

/** The lane of a request: combination searches are the long ones. */
export function laneOf(input: Pick<SolveInput, 'combinations'>): SolveLane {
  return input.combinations ? 'combinations' : 'single';
}

/** Solve threads per lane now (`SOLVE_THREADS`; 0 solves on the event loop, as a baseline for the load bench). */
let threads = DEFAULT_SOLVE_THREADS;
let pools: Partial<Record<SolveLane, Piscina<SolveTask, SolveOutcome>>> = {};

/** Sets how many solve threads run (createApp, from the configuration); a running pool is ended. */
export function setSolveThreads(count: number): void {
  if (count === threads) return;
  threads = count;
  void closeSolvePool();
}

/** How many solve threads each lane may run (0: solves run on the event loop). */
export function solveThreads(): number {
  return threads;
}

/**
 * The module the threads run. From TypeScript sources (tsx, vitest) it is bundled once per process
 * with esbuild into one plain ES module in the system's temporary folder, named by a hash of its
 * contents (so processes share it and a changed source gets a new file): loaded through tsx inside
 * a thread, the same snapper ran about half as fast as in the main thread (bench notes, stop 11).
 */
function workerModule(): string {
  if (!import.meta.url.endsWith('.ts')) return new URL('./solve-worker.js', import.meta.url).href;
  const { outputFiles } = buildSync({
    entryPoints: [fileURLToPath(new URL('./solve-worker.ts', import.meta.url))],
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    write: false,
    logLevel: 'silent',
  });
  const code = outputFiles[0].contents;
  const file = join(tmpdir(), `shelfmatch-solve-worker-${createHash('sha256').update(code).digest('hex').slice(0, 16)}.mjs`);
  if (!existsSync(file)) {
    // Written whole under another name first, so a thread never loads half a file.
    const partial = `${file}.${process.pid}.partial`;
    writeFileSync(partial, code);
    renameSync(partial, file);
  }
  return pathToFileURL(file).href;
}

/** Solves handed to each lane and not yet answered, and solves given up because their signal fired. */
const inLane: Record<SolveLane, number> = { single: 0, combinations: 0 };
let abandoned = 0;

/** The module the threads run, bundled once per process. */
let bundled: string | null = null;

function solvePool(lane: SolveLane): Piscina<SolveTask, SolveOutcome> {
  let pool = pools[lane];
  if (!pool) {
    bundled ??= workerModule();
    pool = new Piscina({
      filename: bundled,
      minThreads: 0,
      maxThreads: threads,
      // A thread idle this long ends (it keeps its stock indexes until then).
      idleTimeout: 60_000,
    });
    pools[lane] = pool;
  }
  return pool;
}

/**
 * Snaps `input` to the stock `parts` (read for `stockKey` with `fingerprint`) on a thread of its
 * lane ({@link laneOf}). When `signal` fires, a queued solve leaves the queue and a running one
 * stops (piscina ends its thread; the lane starts another when needed), and the promise rejects
 * with the signal's reason.
 * @throws EngineInputError when the engine refuses the request, as snapMatch would
 * @throws the signal's reason (an AbortError) once `signal` has fired
 */
export async function snapOnThread(
  input: SolveInput,
  settings: SnapSettings,
  options: SnapMatchOptions,
  stock: { key: string; fingerprint: string; parts: SnapPart[] },
  signal?: AbortSignal,
): Promise<SnappedSolveResponse> {
  const task: SolveTask = { input, settings, options, stockKey: stock.key, fingerprint: stock.fingerprint };
  signal?.throwIfAborted();
  if (threads === 0) return answerOf(solveHere({ ...task, parts: stock.parts }));
  const lane = laneOf(input);
  const pool = solvePool(lane);
  inLane[lane] += 1;
  try {
    let outcome = await pool.run(task, { signal });
    if (outcome.kind === 'need-stock') outcome = await pool.run({ ...task, parts: stock.parts }, { signal });
    return answerOf(outcome);
  } catch (error) {
    if (signal?.aborted) abandoned += 1;
    throw error;
  } finally {
    inLane[lane] -= 1;
  }
}

/**
 * How many solves are queued or running on the threads now, and how many were given up so far
 * (their caller went away), for the tests.
 */
export function solveCounts(): { inFlight: number; abandoned: number } {
  return { inFlight: inLane.single + inLane.combinations, abandoned };
}

/** One lane's work now: solves running on its threads and solves waiting for one. */
export interface LaneLoad {
  running: number;
  queued: number;
}

/**
 * What the solve threads are doing now, per lane, for operators (the health route): the threads
 * each lane may run (0: solves run on the event loop) and its running and queued solves.
 */
export function solveLoad(): { threadsPerLane: number; single: LaneLoad; combinations: LaneLoad } {
  const load = (lane: SolveLane): LaneLoad => {
    const queued = Math.min(inLane[lane], pools[lane]?.queueSize ?? 0);
    return { running: inLane[lane] - queued, queued };
  };
  return { threadsPerLane: threads, single: load('single'), combinations: load('combinations') };
}

function answerOf(outcome: SolveOutcome): SnappedSolveResponse {
  if (outcome.kind === 'input-error') {
    const [first] = outcome.details;
    throw new EngineInputError(first.field, first.value, outcome.message, outcome.details);
  }
  if (outcome.kind === 'need-stock') throw new Error('a solve thread asked for the stock it was just sent');
  return outcome.response;
}

/** Ends the solve threads of both lanes (server shutdown); a later solve starts them again. */
export async function closeSolvePool(): Promise<void> {
  const ending = Object.values(pools);
  pools = {};
  await Promise.all(ending.map((pool) => pool.destroy()));
}
