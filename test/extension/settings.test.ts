import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ignore from 'ignore';
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_EXTENSION_SETTINGS,
  enabledPatterns,
  globToGitignore,
  parseDimensions,
  parseLanguages,
  readSettings,
  toWorkerConfig,
} from '../../src/extension/settings.js';
import { DEFAULT_MAX_FILE_BYTES, DEFAULT_SCAN_OPTIONS } from '../../src/node/scan.js';
import { REPO_ROOT } from '../helpers/shared.js';

describe('readSettings', () => {
  it('gives the defaults for missing values', () => {
    expect(readSettings(() => undefined)).toEqual(DEFAULT_EXTENSION_SETTINGS);
  });

  it('keeps valid values and falls back on wrong types or ranges', () => {
    const values: Record<string, unknown> = {
      include: ['**/*.md', 3, ''],
      exclude: 'notes',
      maxFileSizeKB: 0,
      dimensions: '150',
      weighting: 'tfidf',
      useGitignore: false,
      buildOnStartup: 'yes',
      nearbyCount: 500,
      autoRebuild: false,
      followLinksOutside: 'yes',
    };
    expect(readSettings((k) => values[k])).toEqual({
      include: ['**/*.md'],
      exclude: [],
      maxFileSizeKB: 1,
      dimensions: 150,
      weighting: 'tfidf',
      useGitignore: false,
      buildOnStartup: true,
      nearbyCount: 100,
      autoRebuild: false,
      conceptModel: '',
      followLinksOutside: false,
      languages: 'auto',
    });
  });

  it('reads undertone.languages as "auto" or the known codes of a list', () => {
    expect(parseLanguages([])).toBe('auto');
    expect(parseLanguages(undefined)).toBe('auto');
    expect(parseLanguages(['de', 'en', 'de', 'xx', 3])).toEqual(['de', 'en']);
    expect(parseLanguages(['xx'])).toBe('auto');
  });

  it('reads dimensions as "auto" or a whole number of at least 2', () => {
    expect(parseDimensions('auto')).toBe('auto');
    expect(parseDimensions(' 64 ')).toBe(64);
    expect(parseDimensions(64)).toBe(64);
    expect(parseDimensions('1')).toBe('auto');
    expect(parseDimensions(12.5)).toBe('auto');
    expect(parseDimensions('lots')).toBe('auto');
  });
});

describe('undertone.conceptModel', () => {
  it("names the shared model in the worker settings by path and CRC-32 (the file's last four bytes)", () => {
    const dir = mkdtempSync(join(tmpdir(), 'undertone-settings-'));
    try {
      const file = join(dir, 'org.model');
      const bytes = Buffer.alloc(32, 7);
      bytes.writeUInt32LE(0x1234abcd, 28);
      writeFileSync(file, bytes);
      const s = { ...DEFAULT_EXTENSION_SETTINGS, conceptModel: 'org.model' };
      const config = toWorkerConfig(s, [{ name: 'ws', fsPath: dir, filesExclude: {}, key: 'ws' }], join(dir, 'index'));
      expect(config.settings.sharedModel).toEqual({ path: file, key: '1234abcd' });
      const missing = toWorkerConfig({ ...s, conceptModel: join(dir, 'none.model') }, [], join(dir, 'index'));
      expect(missing.settings.sharedModel?.key).toBe('unreadable');
      expect(toWorkerConfig(DEFAULT_EXTENSION_SETTINGS, [], 'x').settings.sharedModel).toBeUndefined();
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('globToGitignore', () => {
  // Reference for the editor side: the glob rules of the editor's documentation ("Glob Patterns
  // Reference": `*` within one path segment, `**` across segments, `{a,b}` alternatives, patterns
  // relative to the workspace folder; recalled from memory). Reference for the scanner side: the
  // `ignore` package, which implements gitignore(5). Each case lists paths and whether the editor
  // glob matches them; the translated patterns must give the same answers.
  const cases: [string, [string, boolean][]][] = [
    [
      '**/*.md',
      [
        ['a.md', true],
        ['notes/b.md', true],
        ['notes/b.mdx', false],
      ],
    ],
    [
      '*.md',
      [
        ['a.md', true],
        ['notes/b.md', false],
      ],
    ],
    [
      'docs/**',
      [
        ['docs/a.ts', true],
        ['docs/x/y.ts', true],
        ['src/docs/a.ts', false],
      ],
    ],
    [
      '**/node_modules',
      [
        ['node_modules/p/i.js', true],
        ['a/node_modules/p/i.js', true],
        ['a/node_modulesx/i.js', false],
      ],
    ],
    [
      '**/*.{ts,js}',
      [
        ['a.ts', true],
        ['x/b.js', true],
        ['x/c.tsx', false],
      ],
    ],
    [
      '{src,test}/gen/**',
      [
        ['src/gen/a.ts', true],
        ['test/gen/b.ts', true],
        ['lib/gen/c.ts', false],
      ],
    ],
    [
      './build/',
      [
        ['build/out.js', true],
        ['x/build/out.js', false],
      ],
    ],
  ];
  for (const [glob, paths] of cases) {
    it(`translates ${glob}`, () => {
      const matcher = ignore().add(globToGitignore(glob));
      for (const [path, expected] of paths) expect([path, matcher.ignores(path)]).toEqual([path, expected]);
    });
  }

  it('expands nested braces and escapes a leading "!"', () => {
    expect(globToGitignore('a/{b,c{1,2}}.md')).toEqual(['a/b.md', 'a/c1.md', 'a/c2.md']);
    expect(globToGitignore('!keep.md')).toEqual(['/\\!keep.md']);
  });
});

describe('toWorkerConfig', () => {
  it('merges files.exclude per folder and converts sizes and index settings', () => {
    const config = toWorkerConfig(
      { ...DEFAULT_EXTENSION_SETTINGS, exclude: ['**/*.log'], maxFileSizeKB: 10, dimensions: 40 },
      [
        {
          name: 'app',
          key: 'app',
          fsPath: '/w/app',
          filesExclude: { '**/.git': true, '**/*.tmp': false, '**/*.js': { when: '$(basename).ts' } },
        },
      ],
      '/storage/index.undertone',
    );
    expect(config).toEqual({
      roots: [{ name: 'app', fsPath: '/w/app', exclude: ['**/.git'] }],
      indexFile: '/storage/index.undertone',
      settings: { k: 40, weighting: 'log-entropy' },
      include: [],
      exclude: ['**/*.log'],
      maxFileBytes: 10 * 1024,
      honourGitignore: true,
      followLinksOutside: false,
    });
  });

  it('takes only switched-on files.exclude entries', () => {
    expect(enabledPatterns({ a: true, b: false, c: { when: 'x' } })).toEqual(['a']);
    expect(enabledPatterns(undefined)).toEqual([]);
  });
});

describe('the file-size cap', () => {
  it("is one number: the manifest's default setting equals the scanner's DEFAULT_MAX_FILE_BYTES", () => {
    const manifest = JSON.parse(readFileSync(join(REPO_ROOT, 'package.json'), 'utf8')) as {
      contributes: { configuration: { properties: Record<string, { default: unknown }> } };
    };
    expect(manifest.contributes.configuration.properties['undertone.maxFileSizeKB'].default).toBe(DEFAULT_MAX_FILE_BYTES / 1024);
    expect(DEFAULT_EXTENSION_SETTINGS.maxFileSizeKB * 1024).toBe(DEFAULT_MAX_FILE_BYTES);
    expect(DEFAULT_SCAN_OPTIONS.maxFileBytes).toBe(DEFAULT_MAX_FILE_BYTES);
  });
});
