/** The small vocabulary every engine module shares (handbook rf-engine.md; api.md field values). */

/** What a part is. */
export type PartKind = 'capacitor' | 'inductor';

/** Where an element sits in an L network. */
export type Position = 'series' | 'shunt';

/** How the parts of one element are joined: one part, two in series, two in parallel. */
export type Arrangement = 'single' | 'series' | 'parallel';

/** Which side of the L network the shunt element is on. */
export type Placement = 'shunt-at-load' | 'shunt-at-source';

/** The frequency response class of a network. */
export type ResponseClass = 'low-pass' | 'high-pass' | 'mixed';

/** `2 pi f`: angular frequency in rad/s from frequency in Hz. */
export function angularFrequency(frequencyHz: number): number {
  return 2 * Math.PI * frequencyHz;
}
