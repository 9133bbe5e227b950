/**
 * A static binary tree over points of one complex plane (impedances `R + jX` or admittances
 * `G + jB`), sorted by their imaginary part, with a bounding box and the lowest frequency-limit tier
 * in every node. The snapper's searches walk it to skip whole ranges of parts (or of part pairs, by
 * walking two nodes at once) whose bound cannot beat the fits already found: a branch and bound over
 * sorted candidates, the "searched outward from the target" of rf-engine.md "Snapping".
 *
 * Layout: heap order, root 1, children `2i` and `2i + 1`, leaves `leafCount .. 2 leafCount - 1`
 * (leafCount a power of two; padding leaves are empty, `count = 0`). Leaves in index order are sorted
 * by imaginary part, so two nodes at one level never overlap and the lower index comes first.
 */

/** The tree; every per-node array has length `2 leafCount`. */
export interface ImmittanceTree {
  /** Leaves: a power of two >= the number of points (1 when there are none). */
  readonly leafCount: number;
  /** Candidate index of each leaf slot, -1 for padding. */
  readonly order: Int32Array;
  readonly reMin: Float64Array;
  readonly reMax: Float64Array;
  readonly imMin: Float64Array;
  readonly imMax: Float64Array;
  /** Lowest tier (0 within limits, 1 above limit) of the node's points. */
  readonly minTier: Uint8Array;
  /** Points under the node. */
  readonly count: Int32Array;
}

/**
 * Builds the tree over the first `n` points `re[i] + j im[i]`, sorted by `im` (then `re`, then index,
 * so equal points keep a fixed order). O(n log n).
 */
export function buildImmittanceTree(re: Float64Array, im: Float64Array, tier: Uint8Array, n: number): ImmittanceTree {
  let leafCount = 1;
  while (leafCount < n) leafCount *= 2;
  const sorted = Array.from({ length: n }, (_, i) => i).sort((a, b) => im[a] - im[b] || re[a] - re[b] || a - b);
  const size = 2 * leafCount;
  const order = new Int32Array(leafCount).fill(-1);
  const reMin = new Float64Array(size).fill(Infinity);
  const reMax = new Float64Array(size).fill(-Infinity);
  const imMin = new Float64Array(size).fill(Infinity);
  const imMax = new Float64Array(size).fill(-Infinity);
  const minTier = new Uint8Array(size).fill(255);
  const count = new Int32Array(size);
  for (let slot = 0; slot < n; slot++) {
    const i = sorted[slot];
    const node = leafCount + slot;
    order[slot] = i;
    reMin[node] = reMax[node] = re[i];
    imMin[node] = imMax[node] = im[i];
    minTier[node] = tier[i];
    count[node] = 1;
  }
  for (let node = leafCount - 1; node >= 1; node--) {
    const l = 2 * node;
    const r = l + 1;
    reMin[node] = Math.min(reMin[l], reMin[r]);
    reMax[node] = Math.max(reMax[l], reMax[r]);
    imMin[node] = Math.min(imMin[l], imMin[r]);
    imMax[node] = Math.max(imMax[l], imMax[r]);
    minTier[node] = Math.min(minTier[l], minTier[r]);
    count[node] = count[l] + count[r];
  }
  return { leafCount, order, reMin, reMax, imMin, imMax, minTier, count };
}
