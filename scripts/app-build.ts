/**
 * Builds the Angular app for production when its sources changed since the last build. The hash of
 * every input file is kept beside the output, so a second start with nothing changed skips the build.
 */
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { spawnSync } from 'node:child_process';

/** Where `ng build` puts the browser files (angular.json `outputPath` + `/browser`). */
export const APP_DIST = 'dist/shelfmatch/browser';
const INPUTS = ['src', 'shared', 'angular.json', 'tsconfig.json', 'tsconfig.app.json', 'package-lock.json'];
const STAMP = 'dist/shelfmatch/.source-hash';

/** SHA-256 over the paths and contents of every app input under `root`. */
export function appSourceHash(root: string): string {
  const hash = createHash('sha256');
  const files: string[] = [];
  const walk = (p: string) => {
    if (!existsSync(p)) return;
    if (statSync(p).isDirectory()) for (const e of readdirSync(p)) walk(join(p, e));
    else files.push(p);
  };
  for (const input of INPUTS) walk(join(root, input));
  for (const f of files.sort()) {
    hash.update(relative(root, f));
    hash.update(readFileSync(f));
  }
  return hash.digest('hex');
}

/** Runs the production build in `root` unless the stamp matches; returns whether it built. */
export function buildAppIfStale(root: string): boolean {
  const want = appSourceHash(root);
  const stampFile = join(root, STAMP);
  if (existsSync(join(root, APP_DIST, 'index.html')) && existsSync(stampFile) && readFileSync(stampFile, 'utf8') === want) return false;
  console.log('Building the app (production)...');
  const r = spawnSync(join(root, 'node_modules/.bin/ng'), ['build', '--configuration', 'production'], {
    cwd: root,
    stdio: 'inherit',
    env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
  });
  if (r.status !== 0) throw new Error(`The app build failed (exit ${r.status}).`);
  writeFileSync(stampFile, want);
  return true;
}

if (import.meta.url === `file://${process.argv[1]}`) buildAppIfStale(process.cwd());
