/**
 * Shortfall calculations (pure, shared by server and browser): buy-to values, attrition, minimum
 * SRF, the tolerance that keeps the worst case within budget, merging of equal lines, and the
 * next-best stocked part for a short element.
 */
export * from './attrition.js';
export * from './buy-to-value.js';
export * from './match-design.js';
export * from './minimum-srf.js';
export * from './shortfall-lines.js';
export * from './substitute-part.js';
export * from './tolerance-needed.js';
