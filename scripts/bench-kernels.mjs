// `npm run bench:kernels`: bundles bench/kernels.bench.ts and the kernels of another revision
// (taken out of git; default: the last revision with the hand-encoded bytecode kernels), then runs
// the two side by side. Options: --legacy-rev REV, --rounds N (default 5), --reps N (default 6).
import { build } from 'esbuild';
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const HAND_ENCODED = 'df7537a235ec013d0dc488f0ec856aa4da15d096';
const arg = (name, fallback) => {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : fallback;
};
const rev = arg('legacy-rev', HAND_ENCODED);
const legacyDir = join(root, 'out', 'bench', 'legacy-kernels');
mkdirSync(legacyDir, { recursive: true });
for (const file of ['encoder.ts', 'simdKernels.ts', 'dotKernel.ts', 'codeDotKernel.ts']) {
  try {
    writeFileSync(join(legacyDir, file), execFileSync('git', ['show', `${rev}:src/core/matrix/wasm/${file}`], { cwd: root }));
  } catch {
    console.error(`Cannot read src/core/matrix/wasm/${file} at revision ${rev} (a shallow clone lacks it: git fetch --unshallow).`);
    process.exit(2);
  }
}
writeFileSync(
  join(legacyDir, 'entry.ts'),
  "export { kernelModuleBytes } from './simdKernels.js';\nexport { dotModuleBytes } from './dotKernel.js';\nexport { codeDotModuleBytes } from './codeDotKernel.js';\n",
);
const common = { bundle: true, platform: 'node', target: 'node20', format: 'esm', logLevel: 'warning', absWorkingDir: root };
await build({ ...common, entryPoints: [join(legacyDir, 'entry.ts')], outfile: join(root, 'out', 'bench', 'legacy-kernels.mjs') });
await build({ ...common, entryPoints: ['bench/kernels.bench.ts'], outfile: join(root, 'out', 'bench', 'kernels.mjs') });
const passOn = ['rounds', 'reps'].flatMap((n) => (arg(n) ? [`--${n}`, arg(n)] : []));
const r = spawnSync(
  process.execPath,
  [
    join(root, 'out', 'bench', 'kernels.mjs'),
    '--legacy',
    join(root, 'out', 'bench', 'legacy-kernels.mjs'),
    '--legacy-rev',
    rev.slice(0, 7),
    ...passOn,
  ],
  { stdio: 'inherit' },
);
process.exit(r.status ?? 1);
