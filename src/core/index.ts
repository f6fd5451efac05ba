/** Public API of the core: pure TypeScript, no editor import, no file system. */
export * from './errors.js';
export * from './random.js';
export * from './matrix/sparse.js';
export * from './text/tokenize.js';
export * from './index/settings.js';
export * from './index/termCounts.js';
export * from './index/conceptModel.js';
export * from './index/lsiIndex.js';
export * from './index/indexBuilder.js';
export * from './index/serialize.js';
export * from './svd/randomizedSvd.js';
export * from './svd/chooseK.js';
export * from './eval/retrievalMetrics.js';
export * from './lookalike/index.js';
export * from './map/index.js';
