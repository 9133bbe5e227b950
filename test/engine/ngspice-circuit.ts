/**
 * Test helper: writes a SPICE netlist for a ladder between two series-equivalent ports (R plus the
 * ideal L or C that gives X at f0, the same circuit port-model.ts evaluates), runs Debian's ngspice
 * in batch mode and reads the AC results back at full precision.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Ladder, PartModel, PortModel } from '../../shared/engine/index.js';

/** Numbers as SPICE reads them, with all 17 significant digits. */
const n = (x: number) => x.toExponential(16);

/** Whether ngspice runs; tries Debian's package once when it is missing and we are root. */
export function ensureNgspice(): { available: boolean; reason: string } {
  const probe = () => spawnSync('ngspice', ['-v'], { encoding: 'utf8' }).status === 0;
  if (probe()) return { available: true, reason: '' };
  if (process.getuid?.() === 0) {
    const install = () => spawnSync('apt-get', ['install', '-y', 'ngspice'], { encoding: 'utf8', stdio: 'ignore' }).status === 0;
    if (!install()) {
      spawnSync('apt-get', ['update'], { stdio: 'ignore' });
      install();
    }
    if (probe()) return { available: true, reason: '' };
  }
  return { available: false, reason: 'ngspice is not installed and `apt-get install -y ngspice` did not succeed' };
}

/** Where a part's terminal and winding voltages can be read after the run. */
export interface PartProbe {
  part: PartModel;
  /** Vector for the voltage across the part's terminals. */
  terminal: string;
  /** Vector for the voltage across the inductance alone (inductors only). */
  winding: string | null;
}

/** A netlist and what to read from it. */
export interface SpiceCircuit {
  lines: string[];
  /** Vector of the voltage across the load resistor. */
  loadVector: string;
  probes: PartProbe[];
}

function seriesEquivalent(port: PortModel): { r: number; x: number; f0: number } {
  if (port.model !== 'series-equivalent') throw new Error('the ngspice check models ports as series-equivalent circuits');
  return { r: port.resistanceOhm, x: port.reactanceOhm, f0: port.frequencyHz };
}

const voltage = (a: string, b: string) => (b === '0' ? `v(${a})` : `v(${a},${b})`);

/** Builds the netlist: source V with amplitude `sourceAmplitudeV` behind Rs + jXs, the ladder, then jXL + RL. */
export function buildCircuit(ladder: Ladder, source: PortModel, load: PortModel, sourceAmplitudeV = 1): SpiceCircuit {
  const lines = ['* Shelfmatch engine reference check', '.options noopac'];
  let counter = 0;
  const node = () => `n${++counter}`;
  let element = 0;
  const name = (prefix: string) => `${prefix}${++element}`;
  const probes: PartProbe[] = [];

  /** The reactance of a series-equivalent port as an ideal L or C from `a` to `b`. */
  const reactance = (p: PortModel, a: string, b: string) => {
    const { x, f0 } = seriesEquivalent(p);
    const w0 = 2 * Math.PI * f0;
    lines.push(x > 0 ? `${name('L')} ${a} ${b} ${n(x / w0)}` : `${name('C')} ${a} ${b} ${n(-1 / (w0 * x))}`);
  };

  const emitPart = (part: PartModel, a: string, b: string) => {
    if (part.kind === 'capacitor') {
      const pieces: string[] = [`C ${n(part.nominalSi)}`];
      if (part.eslH > 0) pieces.push(`L ${n(part.eslH)}`);
      if (part.lossOhm > 0) pieces.push(`R ${n(part.lossOhm)}`);
      let from = a;
      pieces.forEach((piece, i) => {
        const to = i === pieces.length - 1 ? b : node();
        const [kind, value] = piece.split(' ');
        lines.push(`${name(kind)} ${from} ${to} ${value}`);
        from = to;
      });
      probes.push({ part, terminal: voltage(a, b), winding: null });
    } else {
      const inner = part.lossOhm > 0 ? node() : b;
      lines.push(`${name('L')} ${a} ${inner} ${n(part.nominalSi)}`);
      if (part.lossOhm > 0) lines.push(`${name('R')} ${inner} ${b} ${n(part.lossOhm)}`);
      if (part.cpF > 0) lines.push(`${name('C')} ${a} ${b} ${n(part.cpF)}`);
      probes.push({ part, terminal: voltage(a, b), winding: voltage(a, inner) });
    }
  };

  // Source: VS, then Rs, then the source reactance (if any).
  lines.push(`VS src 0 dc 0 ac ${n(sourceAmplitudeV)}`);
  const zs = seriesEquivalent(source);
  let current = node();
  if (zs.x === 0) lines.push(`${name('R')} src ${current} ${n(zs.r)}`);
  else {
    const middle = node();
    lines.push(`${name('R')} src ${middle} ${n(zs.r)}`);
    reactance(source, middle, current);
  }
  for (const e of ladder.elements) {
    const a = current;
    const b = e.position === 'series' ? node() : '0';
    if (e.arrangement === 'series') {
      const middle = node();
      emitPart(e.parts[0], a, middle);
      emitPart(e.parts[1], middle, b);
    } else {
      for (const p of e.parts) emitPart(p, a, b);
    }
    if (e.position === 'series') current = b;
  }
  // Load: its reactance (if any), then RL to ground, so the voltage across RL is a node voltage.
  const zl = seriesEquivalent(load);
  let loadNode = current;
  if (zl.x !== 0) {
    loadNode = 'rl';
    reactance(load, current, loadNode);
  }
  lines.push(`${name('R')} ${loadNode} 0 ${n(zl.r)}`);
  return { lines, loadVector: voltage(loadNode, '0'), probes };
}

/** One AC run's results: frequencies and each requested vector as re/im arrays. */
export interface AcResult {
  frequenciesHz: number[];
  vectors: Map<string, { re: number[]; im: number[] }>;
}

/** Runs `ngspice -b` on the circuit with `ac lin points start stop` and reads the vectors back. */
export function runAc(circuit: SpiceCircuit, vectors: string[], points: number, startHz: number, stopHz: number): AcResult {
  const dir = mkdtempSync(join(tmpdir(), 'shelfmatch-ngspice-'));
  try {
    const netlist = [
      ...circuit.lines,
      '.control',
      'set numdgt=16',
      'set wr_singlescale',
      `ac lin ${points} ${n(startHz)} ${n(stopHz)}`,
      `wrdata ${join(dir, 'out.txt')} ${vectors.join(' ')}`,
      // Without an explicit quit, batch mode with a .control block exits with status 1.
      'quit 0',
      '.endc',
      '.end',
      '',
    ].join('\n');
    writeFileSync(join(dir, 'circuit.cir'), netlist);
    const run = spawnSync('ngspice', ['-b', join(dir, 'circuit.cir')], { encoding: 'utf8', cwd: dir });
    if (run.status !== 0 || /error/i.test(`${run.stdout}\n${run.stderr}`)) {
      throw new Error(`ngspice failed (${run.status}):\n${run.stdout}\n${run.stderr}\n${netlist}`);
    }
    let text: string;
    try {
      text = readFileSync(join(dir, 'out.txt'), 'utf8');
    } catch {
      throw new Error(`ngspice wrote no output:\n${run.stdout}\n${run.stderr}\n${netlist}`);
    }
    const rows = text.trim().split('\n').map((line) => line.trim().split(/\s+/).map(Number));
    const result: AcResult = { frequenciesHz: rows.map((row) => row[0]), vectors: new Map() };
    vectors.forEach((vector, i) => {
      result.vectors.set(vector, { re: rows.map((row) => row[1 + 2 * i]), im: rows.map((row) => row[2 + 2 * i]) });
    });
    return result;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
