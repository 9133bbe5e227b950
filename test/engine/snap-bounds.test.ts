/**
 * The geometric bounds the snapper prunes with (immittance-box.ts), checked by sampling: every
 * sampled point's image under 1/z lies in `invertBox`, no sampled point is nearer the centre than
 * `boxDistanceSquared`, and no point of the wedge `R >= kappa |X|` is nearer than
 * `wedgeDistanceSquared`. A bound that were too tight would let the search skip a better fit.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { boxDistanceSquared, invertBox, wedgeDistanceSquared } from '../../shared/snapping/immittance-box.js';

// Magnitudes of real immittances (1e-9 and up, or exactly 0): far below that, r^2 underflows to
// subnormal numbers and no bound computed in doubles is meaningful.
// Drawn directly from realistic ranges (0 exactly, or 1e-9 and up) rather than filtered, so that
// fast-check never spins on rejected draws.
const magnitude = (max: number) => fc.oneof(fc.constant(0), fc.double({ min: 1e-9, max, noNaN: true }));
const signed = (max: number) => fc.oneof(fc.constant(0), fc.double({ min: 1e-9, max, noNaN: true }), fc.double({ min: -max, max: -1e-9, noNaN: true }));
const box = fc
  .record({ r1: magnitude(50), dr: magnitude(50), x1: signed(200), dx: magnitude(200) })
  .filter((b) => !(b.r1 === 0 && b.x1 <= 0 && b.x1 + b.dx >= 0));
const unit = fc.double({ min: 0, max: 1, noNaN: true });

describe('immittance bounds', () => {
  it('invertBox holds 1/z of every point of the box', () => {
    fc.assert(
      fc.property(box, fc.array(fc.tuple(unit, unit), { minLength: 1, maxLength: 20 }), (b, samples) => {
        const out = invertBox(b.r1, b.r1 + b.dr, b.x1, b.x1 + b.dx, new Float64Array(4));
        for (const [u, v] of samples) {
          const r = b.r1 + u * b.dr;
          const x = b.x1 + v * b.dx;
          const d = r * r + x * x;
          if (d === 0) continue;
          const g = r / d;
          const s = -x / d;
          const slack = 1e-9 * (Math.abs(g) + Math.abs(s) + 1e-300);
          expect(g).toBeGreaterThanOrEqual(out[0] - slack);
          expect(g).toBeLessThanOrEqual(out[1] + slack);
          expect(s).toBeGreaterThanOrEqual(out[2] - slack);
          expect(s).toBeLessThanOrEqual(out[3] + slack);
        }
      }),
      { numRuns: 2000, seed: 11 },
    );
  });

  it('boxDistanceSquared is the least squared distance to the box', () => {
    fc.assert(
      fc.property(box, fc.double({ min: -300, max: 300, noNaN: true }), fc.double({ min: -300, max: 300, noNaN: true }), fc.array(fc.tuple(unit, unit), { minLength: 1, maxLength: 20 }), (b, cr, ci, samples) => {
        const d2 = boxDistanceSquared(cr, ci, b.r1, b.r1 + b.dr, b.x1, b.x1 + b.dx);
        for (const [u, v] of samples) {
          const r = b.r1 + u * b.dr;
          const x = b.x1 + v * b.dx;
          expect((r - cr) ** 2 + (x - ci) ** 2).toBeGreaterThanOrEqual(d2 * (1 - 1e-12) - 1e-12);
        }
      }),
      { numRuns: 2000, seed: 12 },
    );
  });

  it('wedgeDistanceSquared is the least squared distance to the wedge of one kind', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.1, max: 300, noNaN: true }),
        fc.double({ min: -300, max: 300, noNaN: true }),
        fc.constantFrom(1 as const, -1 as const),
        fc.double({ min: 0, max: 0.5, noNaN: true }),
        fc.array(fc.tuple(fc.double({ min: 0, max: 600, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true })), { minLength: 1, maxLength: 30 }),
        (rf, t, sign, kappa, points) => {
          const d2 = wedgeDistanceSquared(rf, t, sign, kappa);
          for (const [x, extra] of points) {
            const r = kappa * x + extra;
            const dist2 = (r + rf) ** 2 + (sign * x - t) ** 2;
            expect(dist2).toBeGreaterThanOrEqual(d2 * (1 - 1e-12));
          }
        },
      ),
      { numRuns: 2000, seed: 13 },
    );
  });
});
