// Real pages: test/fixtures/gnome-help (Debian gnome-user-docs 43.0-2, CC-BY-SA 3.0). The language of
// each page is the one its folder names, except pages the translators left in English.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  documentUnits,
  languageName,
  languageOf,
  questionFit,
  questionUnits,
  UNDETERMINED,
} from '../../../src/core/translations/language.js';

const FIX = path.resolve(import.meta.dirname, '../../fixtures/gnome-help');
const text = (lang: string, name: string) => readFileSync(path.join(FIX, lang, 'gnome-help', name), 'utf8');

describe('language of a page', () => {
  it('tells the languages of a translated page apart, Chinese and Japanese included', () => {
    const got = Object.fromEntries(['C', 'de', 'fr', 'ja', 'zh_CN', 'ru'].map((l) => [l, languageOf(text(l, 'power-suspend.page'))]));
    expect(got).toEqual({ C: 'eng', de: 'deu', fr: 'fra', ja: 'jpn', zh_CN: 'cmn', ru: 'rus' });
    expect(languageName('cmn')).toBe('Chinese');
    expect(languageOf('<p>ok</p>')).toBe(UNDETERMINED);
  });

  it('fits a short question to the member written in its language', () => {
    const q = questionUnits('what happens when I suspend my computer');
    const fits = ['C', 'de', 'zh_CN'].map((l) => questionFit(q, documentUnits(text(l, 'power-suspend.page'))));
    expect(fits[0]).toBeGreaterThan(fits[1]);
    expect(fits[0]).toBeGreaterThan(fits[2]);
    const zh = questionUnits('挂起计算机');
    expect(zh).toEqual(['挂', '起', '计', '算', '机']);
    expect(questionFit(zh, documentUnits(text('zh_CN', 'power-suspend.page')))).toBeGreaterThan(
      questionFit(zh, documentUnits(text('C', 'power-suspend.page'))),
    );
  });
});
