/** Public API of the core: pure TypeScript, no editor import, no file system. */
export * from './errors.js';
export * from './random.js';
export * from './matrix/sparse.js';
