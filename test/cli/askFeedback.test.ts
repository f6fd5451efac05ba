/**
 * `undertone ask --like FILE --unlike FILE`, and question filler words, end to end through main()
 * on the demo workspace (invented ferry-operator files; behaviour checks, not quality figures:
 * those are in test/core/index/rankingChecks.test.ts on public material).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../helpers/cliRunner.js';
import { REPO_ROOT } from '../helpers/shared.js';

let dir: string;
const run = (...args: string[]) => runCli(args, ['--cache-dir', join(dir, 'cache'), '--quiet']);
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'undertone-ask-feedback-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const demoRoot = join(REPO_ROOT, 'demo', 'workspace');
type Out = { results: { path: string; score: number }[] };

describe('ask with more / fewer like this', () => {
  it('--like moves files like the chosen one up, leaves the chosen one out, and works without text', async () => {
    const like = 'src/weather/swellModel.ts';
    const plain = JSON.parse((await run('ask', demoRoot, 'sailing cancelled', '--json', '--top', '40')).out) as Out;
    const liked = JSON.parse((await run('ask', demoRoot, 'sailing cancelled', '--json', '--top', '40', '--like', like)).out) as Out;
    expect(liked.results.map((r) => r.path)).not.toContain(like);
    const rank = (o: Out, p: string) => o.results.findIndex((r) => r.path === p);
    const weather = liked.results.filter((r) => r.path.startsWith('src/weather/')).map((r) => r.path);
    // Files of the liked file's folder rise on average.
    const gain = weather.reduce((s, p) => s + (rank(plain, p) < 0 ? 40 : rank(plain, p)) - rank(liked, p), 0);
    expect(gain).toBeGreaterThan(0);
    const only = await run('ask', demoRoot, '', '--like', like, '--json', '--top', '5');
    expect(only.code).toBe(0);
    expect((JSON.parse(only.out) as Out).results.some((r) => r.path.startsWith('src/weather/'))).toBe(true);
  });

  it('--unlike moves files like the chosen one down', async () => {
    const unlike = 'notes/ticketing/refund-policy.md';
    const base = JSON.parse(
      (await run('ask', demoRoot, 'refund when a sailing is cancelled for weather', '--json', '--top', '60')).out,
    ) as Out;
    const less = JSON.parse(
      (await run('ask', demoRoot, 'refund when a sailing is cancelled for weather', '--json', '--top', '60', '--unlike', unlike)).out,
    ) as Out;
    const ticketing = (o: Out) => o.results.slice(0, 10).filter((r) => r.path.includes('ticketing')).length;
    expect(less.results.map((r) => r.path)).not.toContain(unlike);
    expect(ticketing(less)).toBeLessThanOrEqual(ticketing(base));
  });

  it('names a file that is not indexed, with a non-zero exit code', async () => {
    const r = await run('ask', demoRoot, 'tides', '--like', 'no/such/file.md');
    expect(r.code).not.toBe(0);
    expect(r.err).toMatch(/no\/such\/file\.md/);
  });

  it('question filler words ("happens", "the code that") carry no share of a score', async () => {
    const r = JSON.parse(
      (
        await run(
          'ask',
          demoRoot,
          "what happens to my ticket when the boat can't sail because of bad weather",
          '--json',
          '--explain',
          '--top',
          '5',
        )
      ).out,
    ) as { results: { explain: { terms: { term: string }[] } }[] };
    const terms = r.results.flatMap((x) => x.explain.terms.map((t) => t.term));
    expect(terms).toContain('weather');
    expect(terms.some((t) => t.startsWith('happen'))).toBe(false);
    const code = JSON.parse(
      (await run('ask', demoRoot, 'where is the code that issues refunds', '--json', '--explain', '--top', '5')).out,
    ) as { results: { explain: { terms: { term: string }[] } }[] };
    expect(code.results.flatMap((x) => x.explain.terms.map((t) => t.term))).not.toContain('code');
  });
});
