/**
 * The cautions shown near every result (handbook product.md, "Cautions the product shows"), in
 * Shelfmatch's own words.
 */

/** Cautions every solve returns. */
export const STANDING_CAUTIONS: readonly string[] = Object.freeze([
  'Treat every network here as a starting point: build it and measure it on a vector network analyser before you rely on it.',
  'High-Q networks build up high voltages and currents even at modest power. Check each part against its voltage and current rating; give an RF power and Shelfmatch works the stresses out. Datasheet ratings are DC figures, so leave margin at RF.',
  'A transmitter using this match must meet the radio regulations where it operates.',
  'Where local codes or licensed practice ask for more, follow them.',
]);

/** Node Q above which a network is called narrow and tolerance-sensitive. */
export const HIGH_NODE_Q = 10;

/** Standing cautions plus those the result calls for. */
export function cautionsFor(result: { maxNodeQ: number; powerW: number | null; maxPeakVoltageV: number | null }): string[] {
  const cautions = [...STANDING_CAUTIONS];
  if (result.maxNodeQ > HIGH_NODE_Q) {
    cautions.push(
      `At least one network has a node Q above ${HIGH_NODE_Q} (${result.maxNodeQ.toFixed(1)}): it is narrow, and part tolerances and losses move it a lot.`,
    );
  }
  if (result.powerW !== null && result.maxPeakVoltageV !== null) {
    cautions.push(
      `At ${result.powerW} W the largest peak voltage on an element is ${result.maxPeakVoltageV.toPrecision(3)} V: compare it with the ratings of the parts you fit.`,
    );
  }
  return cautions;
}
