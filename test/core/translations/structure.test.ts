// Real pages: test/fixtures/gnome-help (Debian gnome-user-docs 43.0-2, CC-BY-SA 3.0).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { structureContainment, structureSignature, structureSimilarity } from '../../../src/core/translations/structure.js';

const FIX = path.resolve(import.meta.dirname, '../../fixtures/gnome-help');
const page = (lang: string, name: string) => structureSignature(readFileSync(path.join(FIX, lang, 'gnome-help', name), 'utf8'));

describe('structure signatures', () => {
  it('keeps markup, link targets, numbers and identifiers, and drops prose words', () => {
    const sig = structureSignature(
      'Title\n=====\n\nSee :ref:`power-mgmt` and `echo mem > /sys/power/state` (since 2.6.30).\n\n- one\n- two',
    );
    expect(sig.get('underline:=')).toBe(1);
    expect(sig.get('role:ref:power-mgmt')).toBe(1);
    expect(sig.get('num:2.6.30')).toBe(1);
    expect(sig.get('list:-')).toBe(2);
    expect([...sig.keys()].some((k) => k.includes('Title') || k.includes('See'))).toBe(false);
  });

  it('finds a page and its translations near-identical in structure, and other pages far less so', () => {
    const c = page('C', 'power-suspend.page');
    for (const lang of ['de', 'fr', 'ja', 'zh_CN', 'ru'])
      expect(structureContainment(c, page(lang, 'power-suspend.page')), lang).toBeGreaterThanOrEqual(0.75);
    const other = page('de', 'net-wireless-connect.page');
    expect(structureContainment(c, other)).toBeLessThan(structureContainment(c, page('de', 'power-suspend.page')));
    expect(structureSimilarity(c, c)).toBe(1);
    expect(structureSimilarity(new Map(), new Map())).toBe(0);
  });
});
