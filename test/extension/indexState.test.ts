import { describe, expect, it } from 'vitest';
import {
  canSearch,
  noIndexReason,
  statusActions,
  statusBarModel,
  summaryOf,
  unavailableReason,
  type IndexState,
} from '../../src/extension/indexState.js';

const summary = { files: 1234, k: 96, terms: 5000, staleness: { changedFiles: 0, changedShare: 0, newTermMass: 0, residualRatio: 1 } };

describe('status bar', () => {
  it('shows files and k when ready, a percentage while building, a warning when out of date', () => {
    expect(statusBarModel({ kind: 'ready', summary }).text).toBe('$(pulse) Undertone: 1,234 files, k=96');
    expect(statusBarModel({ kind: 'building', percent: 42, background: false, previous: null }).text).toBe(
      '$(sync~spin) Undertone: indexing 42%',
    );
    const stale = statusBarModel({ kind: 'stale', summary, reason: '20% of files changed' });
    expect(stale.text).toBe('$(warning) Undertone: out of date');
    expect(stale.tooltip).toContain('20% of files changed');
    expect(stale.background).toBe('statusBarItem.warningBackground');
  });

  it('shows the item from the start, saying it is loading', () => {
    expect(statusBarModel({ kind: 'starting' }).text).toBe('$(sync~spin) Undertone: loading…');
  });

  it('says when a first build offers word-match results only, and keeps the plain percentage otherwise', () => {
    const early = statusBarModel({ kind: 'building', percent: 43, background: false, previous: null, wordMatch: 8863 });
    expect(early.text).toBe('$(sync~spin) Undertone: word match only — concepts 43%');
    expect(early.tooltip).toContain('8,863 files by their words alone');
    expect(early.tooltip).toContain('Nearby, topics and the map follow');
    // A rebuild keeps the previous index (full ranking) in use: no word-match wording.
    expect(statusBarModel({ kind: 'building', percent: 43, background: true, previous: summary, wordMatch: 8863 }).text).toBe(
      '$(sync~spin) Undertone: indexing 43%',
    );
    expect(canSearch({ kind: 'building', percent: 43, background: false, previous: null, wordMatch: 8863 })).toBe(true);
    expect(canSearch({ kind: 'building', percent: 43, background: false, previous: null })).toBe(false);
    const actions = statusActions({ kind: 'building', percent: 43, background: false, previous: null, wordMatch: 10 });
    expect(actions.find((a) => a.command === 'undertone.search')?.description).toBe('word match only until the index is built');
    expect(actions.some((a) => a.command === 'undertone.showNearby')).toBe(false);
  });

  it('says in the tooltip that the previous index stays in use during a rebuild', () => {
    expect(statusBarModel({ kind: 'building', percent: 5, background: true, previous: summary }).tooltip).toContain(
      'previous index (1,234 files) stays in use',
    );
  });
});

describe('status actions', () => {
  const commands = (s: IndexState) => statusActions(s).map((a) => a.command);

  it('offers search and nearby only when an index exists', () => {
    expect(commands({ kind: 'ready', summary })).toEqual([
      'undertone.search',
      'undertone.showNearby',
      'undertone.rebuildIndex',
      'undertone.deleteIndex',
      'undertone.showLog',
    ]);
    expect(commands({ kind: 'none' })).toEqual(['undertone.rebuildIndex', 'undertone.deleteIndex', 'undertone.showLog']);
    expect(statusActions({ kind: 'none' })[0].label).toBe('$(database) Build Index');
    // One name for the command everywhere, whether an index exists or not.
    expect(statusActions({ kind: 'ready', summary }).find((a) => a.command === 'undertone.rebuildIndex')!.label).toBe(
      '$(refresh) Build Index',
    );
  });

  it('offers cancel instead of rebuild while building, and nothing where files cannot be read', () => {
    expect(commands({ kind: 'building', percent: 1, background: true, previous: summary })).toContain('undertone.cancelIndexing');
    expect(commands({ kind: 'building', percent: 1, background: true, previous: summary })).not.toContain('undertone.rebuildIndex');
    expect(statusActions({ kind: 'unavailable', reason: 'virtual' })).toEqual([]);
  });

  it('keeps the previous summary while building or after a failure', () => {
    expect(summaryOf({ kind: 'building', percent: 1, background: true, previous: summary })).toBe(summary);
    expect(summaryOf({ kind: 'failed', message: 'x', previous: null })).toBeNull();
  });
});

describe('reasons', () => {
  it('names the folders that are not on the local disk', () => {
    expect(unavailableReason([])).toBe('open a folder to index it.');
    expect(unavailableReason(['notes (vscode-vfs)'])).toMatch(/^the folder notes \(vscode-vfs\) is not on this machine's disk/);
    expect(unavailableReason(['a (x)', 'b (y)'])).toMatch(/^the folders a \(x\), b \(y\) are not/);
  });

  it('says why a saved index was not used', () => {
    expect(noIndexReason('damaged', 'index payload fails its checksum')).toBe(
      'the saved index could not be used (index payload fails its checksum)',
    );
    expect(noIndexReason('settings-changed')).toBe('the index settings changed since the saved index was built');
    expect(noIndexReason('missing')).toBe('there is no index for this workspace yet');
  });
});
