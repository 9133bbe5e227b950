/**
 * The Shelfmatch RF engine (handbook rf-engine.md): pure TypeScript shared by the server and the
 * browser. SI units inside; strings with prefixes only through value-parse.ts and value-format.ts.
 */
export * from './abcd.js';
export * from './bandwidth.js';
export * from './cautions.js';
export * from './complex.js';
export * from './e-series.js';
export * from './element-report.js';
export * from './engine-input-error.js';
export * from './l-network.js';
export * from './ladder.js';
export * from './losses.js';
export * from './monte-carlo.js';
export * from './part-kind.js';
export * from './part-model.js';
export * from './port-limits.js';
export * from './port-model.js';
export * from './power-check.js';
export * from './reactance-cancelling.js';
export * from './seeded-random.js';
export * from './solve-ideal.js';
export * from './solve-request.js';
export * from './sweep.js';
export * from './tolerance.js';
export * from './tolerance-codes.js';
export * from './value-format.js';
export * from './value-parse.js';
