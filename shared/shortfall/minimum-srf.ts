/**
 * The lowest self-resonant frequency a bought part may have: the product uses a part up to
 * `usable fraction x SRF` (rf-engine.md, "Frequency limit"), so a part for f0 needs
 * `SRF >= f0 / usable fraction`.
 */

/**
 * Minimum SRF for a part used at `frequencyHz`: `f0 / usableFraction` (rf-engine.md; 868 MHz at
 * the default 0.5 needs 1.736 GHz).
 * @param frequencyHz design frequency f0, Hz (> 0)
 * @param usableSrfFraction the organisation's usable fraction of SRF, above 0 and at most 1
 * @returns Hz
 */
export function minimumSrfHz(frequencyHz: number, usableSrfFraction: number): number {
  if (!(frequencyHz > 0) || !Number.isFinite(frequencyHz)) {
    throw new RangeError(`minimumSrfHz: the frequency must be a finite number of Hz above 0, got ${frequencyHz}`);
  }
  if (!(usableSrfFraction > 0) || !(usableSrfFraction <= 1)) {
    throw new RangeError(`minimumSrfHz: the usable fraction of SRF must be above 0 and at most 1, got ${usableSrfFraction}`);
  }
  return frequencyHz / usableSrfFraction;
}
