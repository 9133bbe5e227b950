/**
 * Reference check against ngspice (Debian's `ngspice` package, a general-purpose circuit simulator):
 * the same networks, written as SPICE netlists, simulated in AC batch mode; TPG from ngspice is
 * `P_L / P_avail = (|V_RL|^2 / (2 RL)) / (|Vs|^2 / (8 Rs))` and must equal the engine's ABCD result
 * within 1e-6 dB over the sweep. Complex ports are modelled on both sides as R plus the real L or C
 * that gives the port reactance at f0 (port-model.ts `series-equivalent`), so both compute the same
 * circuit at every frequency.
 */
import { describe, expect, it } from 'vitest';
import {
  createLadder,
  elementModel,
  idealLadder,
  type Ladder,
  ladderTpg,
  partModel,
  powerCheck,
  type PortModel,
  seriesEquivalentPort,
  solveLNetworks,
} from '../../shared/engine/index.js';
import { buildCircuit, ensureNgspice, runAc } from './ngspice-circuit.js';

const ngspice = ensureNgspice();
if (!ngspice.available) {
  const message = `NGSPICE REFERENCE CHECK NOT RUN: ${ngspice.reason}. Install it with: apt-get install -y ngspice`;
  if (process.env.CI) throw new Error(message);
  console.warn(`\n!!!!!!!!\n${message}\n!!!!!!!!\n`);
}
const suite = ngspice.available ? describe : describe.skip;

const TOLERANCE_DB = 1e-6;

/** Largest |dB difference| between ngspice's TPG and the engine's over an AC sweep. */
function compare(ladder: Ladder, source: PortModel, load: PortModel, points: number, startHz: number, stopHz: number) {
  const circuit = buildCircuit(ladder, source, load, 1);
  const result = runAc(circuit, [circuit.loadVector], points, startHz, stopHz);
  const v = result.vectors.get(circuit.loadVector)!;
  if (source.model !== 'series-equivalent' || load.model !== 'series-equivalent') throw new Error('series-equivalent ports only');
  let worst = 0;
  let minTpg = 1;
  result.frequenciesHz.forEach((f, i) => {
    const spiceTpg = (4 * source.resistanceOhm * (v.re[i] ** 2 + v.im[i] ** 2)) / load.resistanceOhm;
    const engineTpg = ladderTpg(ladder, source, load, f);
    worst = Math.max(worst, Math.abs(10 * Math.log10(spiceTpg) - 10 * Math.log10(engineTpg)));
    minTpg = Math.min(minTpg, engineTpg);
  });
  expect(result.frequenciesHz).toHaveLength(points);
  return { worst, minTpg };
}

const f0 = 868e6;
// A series-RL source and a series-RC load at 868 MHz for which both placements are feasible
// (Rs GL = 0.5, RL Gs = 0.367), so there are four ideal networks.
const zs = { re: 50, im: 15 };
const zl = { re: 20, im: -40 };
const source = seriesEquivalentPort(zs, f0);
const load = seriesEquivalentPort(zl, f0);

suite('ngspice reference check (Debian ngspice, AC batch run)', () => {
  const networks = solveLNetworks(zs, zl, f0).networks;

  it('there are four ideal networks for this complex source and load', () => {
    expect(networks).toHaveLength(4);
  });

  for (const [index, label] of ['shunt-at-load 1', 'shunt-at-load 2', 'shunt-at-source 1', 'shunt-at-source 2'].entries()) {
    it(`ideal network ${label}: TPG over 300 MHz to 2 GHz within 1e-6 dB of ngspice`, () => {
      const network = networks[index];
      expect(`${network.placement} ${network.solution}`).toBe(label);
      const { worst, minTpg } = compare(idealLadder(network.elements), source, load, 171, 300e6, 2e9);
      expect(worst).toBeLessThan(TOLERANCE_DB);
      expect(minTpg).toBeLessThan(0.9); // the sweep really leaves the matched region
    });
  }

  it('a snapped fit with full SRF and loss models (ESR, Q at fq), 100 MHz to 6 GHz past both SRFs, within 1e-6 dB', () => {
    const c = partModel({ kind: 'capacitor', valueSi: 5.6e-12, srfHz: 4.1e9, esrOhm: 0.31 });
    const l = partModel({ kind: 'inductor', valueSi: 12e-9, srfHz: 3.3e9, q: 38, qFrequencyHz: 500e6 });
    const fit = createLadder([elementModel('shunt', 'single', [c]), elementModel('series', 'single', [l])]);
    const { worst } = compare(fit, source, load, 300, 100e6, 6e9);
    expect(worst).toBeLessThan(TOLERANCE_DB);
  });

  it('two-part elements: parallel capacitors in shunt and series inductors in series, within 1e-6 dB', () => {
    const c1 = partModel({ kind: 'capacitor', valueSi: 2.2e-12, srfHz: 7.5e9, esrOhm: 0.4 });
    const c2 = partModel({ kind: 'capacitor', valueSi: 3.3e-12, srfHz: 6.2e9, q: 300, qFrequencyHz: 1e9 });
    const l1 = partModel({ kind: 'inductor', valueSi: 6.8e-9, srfHz: 5.1e9, q: 30, qFrequencyHz: 250e6 });
    const l2 = partModel({ kind: 'inductor', valueSi: 5.6e-9, srfHz: 5.9e9, esrOhm: 0.18 });
    const fit = createLadder([elementModel('shunt', 'parallel', [c1, c2]), elementModel('series', 'series', [l1, l2])]);
    const { worst } = compare(fit, source, load, 250, 100e6, 8e9);
    expect(worst).toBeLessThan(TOLERANCE_DB);
  });

  it('two-part elements the other way round: series capacitors in series, parallel inductors in shunt, within 1e-6 dB', () => {
    const c = partModel({ kind: 'capacitor', valueSi: 5.6e-12, srfHz: 4.4e9, esrOhm: 0.25 });
    const l = partModel({ kind: 'inductor', valueSi: 12e-9, srfHz: 3.4e9, q: 45, qFrequencyHz: 800e6 });
    const fit = createLadder([elementModel('series', 'series', [c, c]), elementModel('shunt', 'parallel', [l, l])]);
    const { worst } = compare(fit, source, load, 250, 100e6, 6e9);
    expect(worst).toBeLessThan(TOLERANCE_DB);
  });

  it('power check at 2 W: peak capacitor voltages and RMS inductor winding currents agree with ngspice to 1e-9', () => {
    const powerW = 2;
    const c1 = partModel({ kind: 'capacitor', valueSi: 2.2e-12, srfHz: 7.5e9, esrOhm: 0.4 });
    const c2 = partModel({ kind: 'capacitor', valueSi: 3.3e-12, srfHz: 6.2e9, esrOhm: 0.2 });
    const l1 = partModel({ kind: 'inductor', valueSi: 6.8e-9, srfHz: 5.1e9, q: 30, qFrequencyHz: 250e6 });
    const l2 = partModel({ kind: 'inductor', valueSi: 5.6e-9, srfHz: 5.9e9, esrOhm: 0.18 });
    const fit = createLadder([elementModel('shunt', 'parallel', [c1, c2]), elementModel('series', 'series', [l1, l2])]);
    // The source's open-circuit peak voltage sqrt(8 P Rs) drives the netlist directly.
    const amplitude = Math.sqrt(8 * powerW * zs.re);
    const circuit = buildCircuit(fit, source, load, amplitude);
    const vectors = [...new Set(circuit.probes.flatMap((p) => [p.terminal, ...(p.winding ? [p.winding] : [])]))];
    const result = runAc(circuit, vectors, 1, f0, f0);
    const w0 = 2 * Math.PI * result.frequenciesHz[0];
    const check = powerCheck(fit, source, load, result.frequenciesHz[0], powerW);
    expect(check.sourcePeakVoltageV).toBeCloseTo(amplitude, 12);
    check.parts.forEach((stress, i) => {
      const probe = circuit.probes[i];
      expect(probe.part).toBe(fit.parts[i]);
      const terminal = result.vectors.get(probe.terminal)!;
      const peak = Math.hypot(terminal.re[0], terminal.im[0]);
      expect(Math.abs(stress.peakVoltageV / peak - 1)).toBeLessThan(1e-9);
      if (probe.winding) {
        const winding = result.vectors.get(probe.winding)!;
        const rms = Math.hypot(winding.re[0], winding.im[0]) / (w0 * probe.part.nominalSi) / Math.SQRT2;
        expect(Math.abs(stress.rmsCurrentA / rms - 1)).toBeLessThan(1e-9);
      }
    });
  });
});
