/**
 * The production bundle's initial transfer size: every script and stylesheet that index.html loads
 * before any lazy route, gzipped at level 9 (what a server with compression would send). Target
 * under 350 kB (handbook quality.md). Builds the app first when its sources changed.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import { APP_DIST, buildAppIfStale } from '../scripts/app-build.js';

const ROOT = resolve(import.meta.dirname, '..');
const TARGET_KB = 350;

buildAppIfStale(ROOT);
const dist = join(ROOT, APP_DIST);
const html = readFileSync(join(dist, 'index.html'), 'utf8');
const initial = new Set<string>();
for (const m of html.matchAll(/<(?:script|link)[^>]+(?:src|href)="([^"]+\.(?:js|css))"/g)) initial.add(m[1]);
// Module preloads and static imports of main: chunks named in <link rel="modulepreload">.
for (const m of html.matchAll(/<link rel="modulepreload" href="([^"]+)"/g)) initial.add(m[1]);

let raw = 0;
let gz = 0;
const rows: string[] = [];
for (const file of initial) {
  const bytes = readFileSync(join(dist, file));
  const g = gzipSync(bytes, { level: 9 }).length;
  raw += bytes.length;
  gz += g;
  rows.push(`  ${file.padEnd(32)} ${(bytes.length / 1024).toFixed(1).padStart(8)} kB raw ${(g / 1024).toFixed(1).padStart(8)} kB gzip`);
}
const lazy = readdirSync(dist).filter((f) => f.endsWith('.js') && !initial.has(f));
console.log('Initial bundle (loaded before any lazy route):');
console.log(rows.join('\n'));
console.log(`  total: ${(raw / 1024).toFixed(1)} kB raw, ${(gz / 1024).toFixed(1)} kB gzip (target < ${TARGET_KB} kB): ${gz / 1024 < TARGET_KB ? 'met' : 'NOT met'}`);
console.log(`Lazy chunks: ${lazy.length}`);
