/**
 * cluster/undertone_cluster/fdlibm.py gives the bits of node's Math.log and Math.log1p (the
 * reference: V8 itself, which runs the index). Inputs: seeded probabilities tf/gf as the entropy
 * weighting forms them, every count from 1 to 200 000 (log1p of term counts), and seeded doubles
 * spread over the whole positive normal range (random exponent and mantissa bits).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../src/core/random.js';
import { referencePython, REPO_ROOT } from '../helpers/shared.js';

describe('fdlibm logarithms in Python', () => {
  it('agree bit for bit with node on 900 000 inputs', () => {
    const rnd = createRandom(314);
    const logIn: number[] = [];
    for (let i = 0; i < 400_000; i++) {
      const tf = 1 + Math.floor(rnd.next() * 60);
      logIn.push(tf / (tf + Math.floor(rnd.next() * 2_000_000)));
    }
    const bits = new DataView(new ArrayBuffer(8));
    for (let i = 0; i < 300_000; i++) {
      bits.setUint32(0, (1 + Math.floor(rnd.next() * 2045)) * 0x100000 + (rnd.nextUint32() & 0xfffff));
      bits.setUint32(4, rnd.nextUint32());
      logIn.push(bits.getFloat64(0));
    }
    const log1pIn = Array.from({ length: 200_000 }, (_, i) => i + 1);
    const dir = mkdtempSync(join(tmpdir(), 'undertone-fdlibm-'));
    try {
      const save = (name: string, a: number[]) => writeFileSync(join(dir, name), new Uint8Array(Float64Array.from(a).buffer));
      save('log-in', logIn);
      save('log-out', logIn.map(Math.log));
      save('log1p-in', log1pIn);
      save('log1p-out', log1pIn.map(Math.log1p));
      const script = `
import sys, json, numpy as np
from undertone_cluster import fdlibm
d = sys.argv[1]
r = lambda n: np.fromfile(d + '/' + n, dtype='<f8')
x, y, c, z = r('log-in'), r('log-out'), r('log1p-in'), r('log1p-out')
print(json.dumps({'n': int(x.size + c.size), 'log': int((fdlibm.log(x) != y).sum()), 'log1p': int((fdlibm.log1p(c) != z).sum()),
                  'numpyLog': int((np.log(x) != y).sum())}))
`;
      const py = spawnSync(referencePython(), ['-c', script, dir], { cwd: join(REPO_ROOT, 'cluster'), encoding: 'utf8' });
      expect(py.status, py.stderr).toBe(0);
      const got = JSON.parse(py.stdout) as { n: number; log: number; log1p: number; numpyLog: number };
      expect(got.n).toBe(900_000);
      expect(got.log).toBe(0);
      expect(got.log1p).toBe(0);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
