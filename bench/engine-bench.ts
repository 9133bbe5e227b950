/**
 * RF engine benchmark (handbook quality.md "Benchmarks"): ideal solves per second, a 1,001-point
 * sweep with full part models (target under 1 ms), Monte Carlo of 10,000 samples, and the typed
 * complex arithmetic against mathjs's Complex on the same sweep, measured side by side.
 * Run: npx tsx bench/engine-bench.ts
 */
import { add, complex as mathComplex, divide, multiply, type Complex as MathComplex } from 'mathjs';
import {
  createLadder,
  elementModel,
  fitLosses,
  type Ladder,
  linearFrequencies,
  monteCarloYield,
  mulberry32,
  partImpedance,
  partModel,
  type PortModel,
  portImpedance,
  seriesEquivalentPort,
  solveIdeal,
  solveLNetworks,
  sweepTpg,
  twoElementTpg,
} from '../shared/engine/index.js';
import { formatTiming, measure, ratio, sinkValue, target } from './report.js';

const f0 = 868e6;
const source = seriesEquivalentPort({ re: 50, im: 0 }, f0);
const load = seriesEquivalentPort({ re: 20, im: -40 }, f0);

// A snapped fit with full models: SRF, loss from Q and from ESR, tolerances.
const c = partModel({ kind: 'capacitor', valueSi: 5.6e-12, srfHz: 4.1e9, esrOhm: 0.31, tolerance: { mode: 'absolute', deltaSi: 0.1e-12 } });
const l = partModel({ kind: 'inductor', valueSi: 12e-9, srfHz: 3.3e9, q: 38, qFrequencyHz: 500e6, tolerance: { mode: 'relative', fraction: 0.05 } });
const single = createLadder([elementModel('shunt', 'single', [c]), elementModel('series', 'single', [l])]);
const c2 = partModel({ kind: 'capacitor', valueSi: 2.2e-12, srfHz: 7.5e9, esrOhm: 0.4, tolerance: { mode: 'absolute', deltaSi: 0.1e-12 } });
const c3 = partModel({ kind: 'capacitor', valueSi: 3.3e-12, srfHz: 6.2e9, q: 300, qFrequencyHz: 1e9, tolerance: { mode: 'absolute', deltaSi: 0.1e-12 } });
const l2 = partModel({ kind: 'inductor', valueSi: 6.8e-9, srfHz: 5.1e9, q: 30, qFrequencyHz: 250e6, tolerance: { mode: 'relative', fraction: 0.02 } });
const l3 = partModel({ kind: 'inductor', valueSi: 5.6e-9, srfHz: 5.9e9, esrOhm: 0.18, tolerance: { mode: 'relative', fraction: 0.02 } });
const pairs = createLadder([elementModel('shunt', 'parallel', [c2, c3]), elementModel('series', 'series', [l2, l3])]);

const frequencies = linearFrequencies(100e6, 3e9, 1001);
const tpgOut = new Float64Array(1001);

/** The same sweep with mathjs Complex for every complex operation (what the engine would be without its typed complex). */
function sweepWithMathjs(ladder: Ladder, sourcePort: PortModel, loadPort: PortModel, f: Float64Array, out: Float64Array): Float64Array {
  const one = mathComplex(1, 0);
  const zero = mathComplex(0, 0);
  const scratch = { re: 0, im: 0 };
  for (let i = 0; i < f.length; i++) {
    const omega = 2 * Math.PI * f[i];
    let a: MathComplex = one;
    let b: MathComplex = zero;
    let cc: MathComplex = zero;
    let d: MathComplex = one;
    for (const element of ladder.elements) {
      const zs = element.parts.map((p) => {
        if (p.kind === 'capacitor') {
          return add(mathComplex(p.lossOhm, omega * p.eslH), divide(one, mathComplex(0, omega * p.nominalSi))) as MathComplex;
        }
        const branch = mathComplex(p.lossOhm, omega * p.nominalSi);
        if (p.cpF === 0) return branch;
        return divide(one, add(divide(one, branch), mathComplex(0, omega * p.cpF))) as MathComplex;
      });
      let z = zs[0];
      if (element.arrangement === 'series') z = add(zs[0], zs[1]) as MathComplex;
      else if (element.arrangement === 'parallel') z = divide(multiply(zs[0], zs[1]), add(zs[0], zs[1])) as MathComplex;
      if (element.position === 'series') {
        b = add(b, multiply(a, z)) as MathComplex;
        d = add(d, multiply(cc, z)) as MathComplex;
      } else {
        const y = divide(one, z) as MathComplex;
        a = add(a, multiply(b, y)) as MathComplex;
        cc = add(cc, multiply(d, y)) as MathComplex;
      }
    }
    const zsRaw = portImpedance(sourcePort, f[i], scratch);
    const zsC = mathComplex(zsRaw.re, zsRaw.im);
    const zlRaw = portImpedance(loadPort, f[i], scratch);
    const zlC = mathComplex(zlRaw.re, zlRaw.im);
    const den = add(add(add(multiply(a, zlC), b), multiply(multiply(cc, zsC), zlC)), multiply(d, zsC)) as MathComplex;
    out[i] = (4 * zsC.re * zlC.re) / (den.re * den.re + den.im * den.im);
  }
  return out;
}

console.log('RF engine benchmark (one core; medians over many runs; ratios measured side by side in this run)\n');

// --- Ideal solves ---------------------------------------------------------------------------
const random = mulberry32(2024);
const ports = Array.from({ length: 1000 }, () => ({
  zs: { re: 1 + 200 * random(), im: 200 * (random() - 0.5) },
  zl: { re: 1 + 200 * random(), im: 200 * (random() - 0.5) },
  f: 1e6 * 10 ** (4 * random()),
}));
let next = 0;
const solve = measure('ideal L solve (solveLNetworks, random complex ports)', () => {
  const p = ports[next++ % ports.length];
  return solveLNetworks(p.zs, p.zl, p.f).networks.length;
}, { samples: 40, batch: 2000 });
const solveFull = measure('ideal solve response (solveIdeal: networks, route, cautions)', () => {
  const p = ports[next++ % ports.length];
  return solveIdeal({ source: p.zs, load: p.zl, frequencyHz: p.f }).networks.length;
}, { samples: 40, batch: 500 });
console.log('Ideal solves');
console.log(formatTiming(solve));
console.log(formatTiming(solveFull));

// --- Sweeps ---------------------------------------------------------------------------------
const sweepSingle = measure('1,001-point sweep, full models, one part per element', () => sweepTpg(single, source, load, frequencies, tpgOut)[500], { samples: 300, batch: 5 });
const sweepPairs = measure('1,001-point sweep, full models, two parts per element', () => sweepTpg(pairs, source, load, frequencies, tpgOut)[500], { samples: 300, batch: 5 });
const mathOut = new Float64Array(1001);
const sweepMath = measure('1,001-point sweep, two parts per element, mathjs Complex', () => sweepWithMathjs(pairs, source, load, frequencies, mathOut)[500], { samples: 30, batch: 1 });
sweepTpg(pairs, source, load, frequencies, tpgOut);
sweepWithMathjs(pairs, source, load, frequencies, mathOut);
let maxDifference = 0;
for (let i = 0; i < 1001; i++) maxDifference = Math.max(maxDifference, Math.abs(10 * Math.log10(tpgOut[i] / mathOut[i])));
console.log('\nSweeps (target under 1 ms)');
console.log(formatTiming(sweepSingle, target(sweepSingle, 1)));
console.log(formatTiming(sweepPairs, target(sweepPairs, 1)));
console.log(formatTiming(sweepMath));
console.log(`  typed complex vs mathjs Complex on the same sweep: typed is ${ratio(sweepMath, sweepPairs)} faster; results agree to ${maxDifference.toExponential(1)} dB`);
console.log('  choice: the typed complex (shared/engine/complex.ts, abcd.ts): mathjs allocates an object per operation');

// --- Snapper inner loop -----------------------------------------------------------------------
const z = { re: 0, im: 0 };
const omega0 = 2 * Math.PI * f0;
const inner = measure('snapper step: part impedance at f0 + two-element TPG', () => {
  partImpedance(l, omega0, z);
  const sr = z.re;
  const si = z.im;
  partImpedance(c, omega0, z);
  const d = z.re * z.re + z.im * z.im;
  return twoElementTpg('shunt-at-source', 50, 0, 20, -40, sr, si, z.re / d, -z.im / d);
}, { samples: 40, batch: 200_000 });
console.log('\nSnapper inner loop');
console.log(formatTiming(inner));

// --- Losses, corners, Monte Carlo -----------------------------------------------------------
const band = { lowHz: 863e6, highHz: 873e6 };
const losses = measure('fitLosses (value error, total, 2^4 corners, 101-point band)', () => fitLosses(pairs, source, load, f0, band).totalDb, { samples: 60, batch: 20 });
const budget = fitLosses(pairs, source, load, f0).totalDb + 0.02;
const mc = measure('Monte Carlo yield, 10,000 samples, four parts', () => monteCarloYield(pairs, source, load, f0, { budgetDb: budget, samples: 10_000, seed: 1 }).yieldFraction, { samples: 30, batch: 1 });
const yieldResult = monteCarloYield(pairs, source, load, f0, { budgetDb: budget, samples: 10_000, seed: 1 });
console.log('\nLosses and yield');
console.log(formatTiming(losses));
console.log(formatTiming(mc, `(yield ${(100 * yieldResult.yieldFraction).toFixed(1)} % within ${budget.toFixed(3)} dB, seed 1)`));
console.log(`\n(checksum ${sinkValue().toExponential(3)})`);
