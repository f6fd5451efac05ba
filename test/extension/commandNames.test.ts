// One name for each command everywhere a person meets it: the manifest's title, welcome texts,
// buttons and messages. The index command was "Rebuild Index" in some places and "Build Index"
// in others; it is "Build Index" everywhere now.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const REPO = path.resolve(import.meta.dirname, '../..');
const manifest = JSON.parse(readFileSync(path.join(REPO, 'package.json'), 'utf8')) as {
  contributes: { commands: { command: string; title: string }[]; viewsWelcome: { contents: string }[] };
};
const sources = readdirSync(path.join(REPO, 'src/extension'))
  .filter((f) => f.endsWith('.ts'))
  .map((f) => [f, readFileSync(path.join(REPO, 'src/extension', f), 'utf8')] as const);

describe('command names', () => {
  const build = manifest.contributes.commands.find((c) => c.command === 'undertone.rebuildIndex')!;

  it('calls the index command by one name in the manifest, the welcome texts and the messages', () => {
    expect(build.title).toBe('Build Index');
    const links = manifest.contributes.viewsWelcome.flatMap((w) =>
      [...w.contents.matchAll(/\[([^\]]+)\]\(command:undertone\.rebuildIndex\)/g)].map((m) => m[1]),
    );
    expect(links.length).toBeGreaterThan(0);
    expect(new Set(links)).toEqual(new Set([build.title]));
    expect(JSON.stringify(manifest)).not.toMatch(/Rebuild Index/);
    for (const [file, text] of sources) expect(`${file}: ${text}`).not.toMatch(/Rebuild Index/);
  });

  it('quotes only command titles that exist when a message names a command', () => {
    const titles = new Set(manifest.contributes.commands.map((c) => c.title));
    for (const [file, text] of sources) {
      for (const m of text.matchAll(/Run "([^"]+)"/g))
        expect(`${file}: ${m[1]}`).toBe(`${file}: ${[...titles].find((t) => t === m[1]) ?? 'no such command'}`);
    }
  });
});
