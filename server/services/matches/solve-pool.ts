/**
 * Solves run on worker threads (piscina), one per core: snapping with combinations can take a
 * second or more of CPU, and on the event loop it would hold up every other request meanwhile
 * (sign-ins, health, stock pages) and let queued database requests time out. The thread runs
 * solve-worker.ts, bundled to plain JavaScript ({@link workerModule}).
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

function solvePool(): Piscina<SolveTask, SolveOutcome> {
  if (!pool) {
    pool = new Piscina({
      filename: workerModule(),
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
