/**
 * Entry of the kernel module: one WebAssembly module with SIMD, importing one shared memory
 * ("env" "memory", 1 to 65536 pages), with no runtime and no data segments, so every byte of that
 * memory belongs to the caller (../wasmArena.ts, ../../../index/search/conceptRows.ts, conceptCodes.ts).
 * All arguments are i32: byte offsets into the memory, counts, and 0/1 flags.
 * Built by scripts/build-kernels.mjs (npm run build:kernels) into ../kernelsWasm.ts.
 */
export { spmm, spmm_f32 } from './spmm';
export { cross } from './cross';
export { times } from './times';
export { dots } from './dots';
export { code_dots } from './codeDots';
export { code_dots_int } from './codeDotsInt';
export { copy_columns, copy_columns_cast } from './copyColumns';
export { spmm_x32 } from './spmmX32';
export { file_rows } from './fileRows';
export { spmm_single } from './spmmSingle';
export { unit_rows } from './unitRows';
export { min_hash } from './minHash';
