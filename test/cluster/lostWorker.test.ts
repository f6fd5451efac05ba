/**
 * The cluster job (cluster/undertone_cluster) when a share of the files takes its worker down
 * every time it is counted: a local Dask cluster (Debian's python3-dask and python3-distributed
 * 2022.12) with two worker processes, and a stand-in for the command line that kills the worker
 * process running it when its share holds the file "poison.txt" (as a crash on a bad file
 * would). The other shares run the real command line. The scheduler reschedules the share after
 * each death; after the scheduler's allowed-failures (set to 1 here, so two deaths, to keep the
 * test short; Dask's default is 3) the job must stop with a clear message naming the share and
 * its first file, exit 1, and write no model: never a model that silently lacks those files.
 * (test/cluster/clusterJob.test.ts shows the other side: a worker lost once costs a recount,
 * not a file.)
 */
import { chmodSync, existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { bundleCli, requireDask, runClusterJob } from '../helpers/clusterHarness.js';

describe('cluster job when a share keeps killing its worker', () => {
  const dir = mkdtempSync(join(tmpdir(), 'undertone-lost-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('stops with the share named and writes no model', async () => {
    requireDask();
    const ws = join(dir, 'ws');
    mkdirSync(ws);
    writeFileSync(join(ws, 'alpha.txt'), 'pumps move water through the pipes of the plant');
    writeFileSync(join(ws, 'beta.txt'), 'valves close the pipes when the pumps stop');
    writeFileSync(join(ws, 'poison.txt'), 'this share stands for a file that crashes the counter');
    await bundleCli(join(dir, 'cli.js'));
    // Called as: <script> count FOLDER --files LIST --out PREFIX --quiet (its parent is the worker).
    const script = join(dir, 'undertone.sh');
    writeFileSync(
      script,
      `#!/bin/sh\nif grep -q poison.txt "$4"; then kill -9 "$PPID"; exit 1; fi\nexec "${process.execPath}" "${join(dir, 'cli.js')}" "$@"\n`,
    );
    chmodSync(script, 0o755);
    const model = join(dir, 'org.model');
    const { code, stderr } = await runClusterJob(
      [ws, '--out', model, '--undertone', script, '--local-workers', '2', '--shard-files', '1', '--k', '2'],
      { ...process.env, DASK_DISTRIBUTED__SCHEDULER__ALLOWED_FAILURES: '1' },
    );
    expect(code, stderr.slice(-3000)).toBe(1);
    expect(stderr).toMatch(
      /undertone-cluster: counting stopped: shard 2 \(1 files from poison\.txt\) took down its worker every time it ran/,
    );
    expect(existsSync(model)).toBe(false);
  }, 300_000);
});
