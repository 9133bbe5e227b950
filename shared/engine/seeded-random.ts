/**
 * A seeded pseudo-random generator, so Monte Carlo yields are reproducible: the same seed gives the
 * same samples on the server and in the browser.
 */

/** A generator of uniform numbers in [0, 1). */
export type UniformRandom = () => number;

/**
 * Mulberry32 (Tommy Ettinger, public domain, 2017): a 32-bit state generator, fast and good enough
 * for tolerance sampling (not for cryptography).
 */
export function mulberry32(seed: number): UniformRandom {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * Standard normal draws by the Box-Muller transform (G. E. P. Box, M. E. Muller, Ann. Math. Stat.
 * 29(2), 1958): `sqrt(-2 ln u1) cos(2 pi u2)`, and the sine twin on the next call.
 */
export function normalSource(uniform: UniformRandom): () => number {
  let spare = 0;
  let hasSpare = false;
  return () => {
    if (hasSpare) {
      hasSpare = false;
      return spare;
    }
    const u1 = 1 - uniform(); // in (0, 1], so the log is finite
    const u2 = uniform();
    const radius = Math.sqrt(-2 * Math.log(u1));
    spare = radius * Math.sin(2 * Math.PI * u2);
    hasSpare = true;
    return radius * Math.cos(2 * Math.PI * u2);
  };
}
