/**
 * The snapper (handbook rf-engine.md "Snapping ideal networks to stock"): pure TypeScript shared by
 * the server and the browser. `snapMatch` is the whole solve; the rest are its parts.
 */
export * from './bound-queue.js';
export * from './exhaustive-search.js';
export * from './fit-collector.js';
export * from './fit-report.js';
export * from './immittance-box.js';
export * from './immittance-tree.js';
export * from './kind-candidates.js';
export * from './nominal-search.js';
export * from './objective-window.js';
export * from './snap-match.js';
export * from './snap-option.js';
export * from './snap-part.js';
export * from './snap-problem.js';
export * from './snapped-fit.js';
export * from './stock-index.js';
export * from './match-sweep.js';
export * from './saved-match.js';
