// Types of build-kernels.mjs, for the test that recompiles the kernels.
export declare const KERNEL_ENTRY: string;
export declare const KERNEL_MODULE: string;
export declare const ASC_FLAGS: readonly string[];
export declare function compilerVersion(): string;
export declare function compileKernels(): Promise<Uint8Array>;
export declare function renderKernelModule(bytes: Uint8Array): string;
