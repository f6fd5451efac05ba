/**
 * Finds the translations of result files in the worker (core/translations/ does the deciding):
 * keys are bucketed by translation key once per index, and a hit's same-key files are read,
 * given a structure signature and compared. What is learned of a file (signature, words, a prose
 * sample for its language) is cached by key, size and modification time, so later searches only
 * read files that changed. A file that cannot be read is left out of its group.
 */
import { languageOf, documentUnits, languageName, proseOf, UNDETERMINED } from '../../core/translations/language.js';
import { groupTranslations, type TranslationDoc } from '../../core/translations/groupTranslations.js';
import { translationPath } from '../../core/translations/pathKey.js';
import { structureSignature, type StructureSignature } from '../../core/translations/structure.js';
import type { LsiIndex } from '../../core/index/lsiIndex.js';

interface Known {
  readonly size: number;
  readonly mtimeMs: number;
  readonly signature: StructureSignature;
  readonly units: ReadonlySet<string>;
  readonly prose: string;
  language?: string;
}

/** Files remembered at most (common practice bound; one entry is a few KB). */
const MAX_KNOWN = 4000;
/** Same-key files looked at per hit at most (a page in more languages than this keeps the rest apart). */
const MAX_SIBLINGS = 48;

export class TranslationFinder {
  private _index: LsiIndex | undefined;
  private _size = -1;
  private _byKey = new Map<string, string[]>();
  private readonly _known = new Map<string, Known>();

  constructor(private readonly _read: (key: string) => Promise<string | null>) {}

  /** The groups (two or more keys) that the given keys belong to, by key; keys without translations are absent. */
  async groupsOf(index: LsiIndex, keys: readonly string[]): Promise<Map<string, string[]>> {
    this.bucket(index);
    const out = new Map<string, string[]>();
    for (const key of keys) {
      if (out.has(key)) continue;
      const same = this._byKey.get(translationPath(key).key) ?? [];
      if (same.length < 2) continue;
      const docs: TranslationDoc[] = [];
      for (const k of same.slice(0, MAX_SIBLINGS).concat(same.slice(0, MAX_SIBLINGS).includes(key) ? [] : [key])) {
        const known = await this.known(index, k);
        if (known) docs.push({ key: k, path: k, signature: known.signature, language: () => this.languageOfKnown(known) });
      }
      for (const group of groupTranslations(docs)) {
        if (!group.includes(key)) continue;
        for (const k of group) out.set(k, group);
      }
    }
    return out;
  }

  /** The words of a file (for fitting a question), if it was looked at. */
  units(key: string): ReadonlySet<string> {
    return this._known.get(key)?.units ?? new Set();
  }

  /** How a member's language is shown: the language code of its path, or the language of its text. */
  label(key: string): string {
    const locale = translationPath(key).locale;
    const known = this._known.get(key);
    const lang = known ? languageName(this.languageOfKnown(known)) : undefined;
    if (locale && locale !== 'C') return lang && lang !== languageName(UNDETERMINED) ? `${locale}, ${lang}` : locale;
    return lang ?? 'original';
  }

  private languageOfKnown(k: Known): string {
    k.language ??= languageOf(k.prose);
    return k.language;
  }

  private bucket(index: LsiIndex): void {
    if (index === this._index && index.size === this._size) return;
    this._index = index;
    this._size = index.size;
    this._byKey = new Map();
    for (const p of index.paths()) {
      const k = translationPath(p).key;
      const list = this._byKey.get(k);
      if (list) list.push(p);
      else this._byKey.set(k, [p]);
    }
  }

  private async known(index: LsiIndex, key: string): Promise<Known | undefined> {
    const meta = index.meta(key);
    if (!meta) return undefined;
    const old = this._known.get(key);
    if (old && old.size === meta.size && old.mtimeMs === meta.mtimeMs) return old;
    const text = await this._read(key).catch(() => null);
    if (text === null) return undefined;
    const k: Known = {
      size: meta.size,
      mtimeMs: meta.mtimeMs,
      signature: structureSignature(text),
      units: documentUnits(text),
      prose: proseOf(text),
    };
    if (this._known.size >= MAX_KNOWN) this._known.delete(this._known.keys().next().value!);
    this._known.set(key, k);
    return k;
  }
}
