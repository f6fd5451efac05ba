import { describe, expect, it } from 'vitest';
import { isHostToPageMessage } from '../../src/core/map/mapMessages.js';
import { MapSession, themeKindName } from '../../src/extension/mapPanelModel.js';
import type { MapDataResult } from '../../src/node/worker/insightProtocol.js';

const paths = ['notes/a.md', 'src/b.ts', 'src/c.ts'];
const mapResult = (fsPaths = paths.map((p) => `/w/${p}`)): MapDataResult => ({
  token: 7,
  data: {
    version: 1,
    title: 'Concept map',
    files: { paths, tokenCounts: [10, 20, 30], topicIds: [0, 0, -1], topTerms: [['a'], ['b'], ['c']] },
    topicLabels: ['alpha'],
    layouts: { quick: { x: [0, 1, 2], y: [0, 1, 2] }, faithful: null },
    spectrum: { singularValues: [3, 2, 1], k: 2, totalEnergy: 14 },
    embedded: null,
  },
  fsPaths,
  ms: 1,
  cached: false,
});

describe('map panel session', () => {
  it('opens the file a dot names only when the index and the path agree', () => {
    const s = new MapSession(mapResult());
    expect(s.fileToOpen({ type: 'open', index: 1, path: 'src/b.ts' })).toBe('/w/src/b.ts');
    expect(s.fileToOpen({ type: 'open', index: 1, path: 'src/c.ts' })).toBeUndefined();
    expect(s.fileToOpen({ type: 'open', index: 3, path: 'src/b.ts' })).toBeUndefined();
    expect(s.fileToOpen({ type: 'open', index: -1, path: 'notes/a.md' })).toBeUndefined();
  });

  it('opens a section of the trail only when the page names a point of the trail it was sent', () => {
    const s = new MapSession(mapResult());
    expect(s.sectionToOpen({ type: 'openSection', point: 0 })).toBeUndefined();
    const point = (title: string, start: number, end: number) => ({ title, start, end, quick: { x: 0, y: 0 }, faithful: null });
    s.setTrail('/w/src/b.ts', { path: 'src/b.ts', points: [point('parse', 0, 12), point('format', 12, 30)] });
    expect(s.sectionToOpen({ type: 'openSection', point: 1 })).toEqual({ fsPath: '/w/src/b.ts', line: 12 });
    expect(s.sectionToOpen({ type: 'openSection', point: 2 })).toBeUndefined();
    s.setTrail(null, null);
    expect(s.sectionToOpen({ type: 'openSection', point: 1 })).toBeUndefined();
  });

  it('finds the dot of the file in the active editor', () => {
    const s = new MapSession(mapResult());
    expect(s.rowOf('/w/src/c.ts')).toBe(2);
    expect(s.rowOf('/elsewhere/x.ts')).toBeNull();
    expect(s.rowOf(undefined)).toBeNull();
  });

  it('sends the page data in a form the page accepts', () => {
    const s = new MapSession(mapResult());
    expect(isHostToPageMessage({ type: 'init', data: s.data })).toBe(true);
    expect(s.token).toBe(7);
  });

  it('refuses a map whose paths do not match its files', () => {
    expect(() => new MapSession(mapResult(['/w/notes/a.md']))).toThrow(/3 files but gives 1/);
  });
});

describe('theme names', () => {
  it('follow the editor’s colour theme kinds (Light 1, Dark 2, HighContrast 3, HighContrastLight 4 in vscode.d.ts)', () => {
    expect([1, 2, 3, 4].map(themeKindName)).toEqual(['light', 'dark', 'high-contrast', 'high-contrast-light']);
    for (const kind of [1, 2, 3, 4]) expect(isHostToPageMessage({ type: 'theme', kind: themeKindName(kind) })).toBe(true);
  });
});
