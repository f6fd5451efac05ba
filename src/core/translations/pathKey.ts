/**
 * Where translations of a page live: documentation trees keep a translated page at the same path
 * with a language code added, as a folder (de/help/x.page, translations/zh_CN/admin/x.rst, C/…
 * for the untranslated original) or in the file name (README.fr.md, guide_ja.md). The translation
 * key of a path is the path with such language segments (and folders named for translations)
 * removed, so a page and its translations share one key. A shared key only nominates candidates:
 * groupTranslations.ts also requires different languages and near-identical structure.
 * Language codes: ISO 639-1 two-letter codes, with an optional region or script (zh_CN, pt-BR,
 * sr@latin), and the POSIX locale "C" that gettext-based trees use for the original.
 */

/** ISO 639-1 codes (the two-letter language codes). */
const ISO_639_1 = new Set(
  (
    'aa ab ae af ak am an ar as av ay az ba be bg bh bi bm bn bo br bs ca ce ch co cr cs cu cv cy da de dv dz ee el en eo es ' +
    'et eu fa ff fi fj fo fr fy ga gd gl gn gu gv ha he hi ho hr ht hu hy hz ia id ie ig ii ik io is it iu ja jv ka kg ki kj kk ' +
    'kl km kn ko kr ks ku kv kw ky la lb lg li ln lo lt lu lv mg mh mi mk ml mn mr ms mt my na nb nd ne ng nl nn no nr nv ny oc ' +
    'oj om or os pa pi pl ps pt qu rm rn ro ru rw sa sc sd se sg si sk sl sm sn so sq sr ss st su sv sw ta te tg th ti tk tl tn ' +
    'to tr ts tt tw ty ug uk ur uz ve vi vo wa wo xh yi yo za zh zu'
  ).split(' '),
);

/** Folder names that hold translations rather than name a language. */
const TRANSLATION_FOLDERS = new Set([
  'translations',
  'translation',
  'i18n',
  'l10n',
  'locale',
  'locales',
  'lang',
  'langs',
  'languages',
  'translated',
]);

const LOCALE = /^([a-z]{2})(?:[_-](?:[A-Za-z]{2}|[A-Za-z]{4}|\d{3}))*(?:@[a-z]+)?$/;

/** The language code if `segment` is one (e.g. "zh_CN", "de", "pt-BR", "C"), else undefined. */
export function localeOf(segment: string): string | undefined {
  if (segment === 'C' || segment === 'POSIX') return 'C';
  const m = LOCALE.exec(segment);
  return m && ISO_639_1.has(m[1]) ? segment : undefined;
}

export interface TranslationPath {
  /** The path with its language segments removed: equal for a page and its translations. */
  readonly key: string;
  /** The language code found in the path, if any. */
  readonly locale: string | undefined;
}

/** Splits a '/'-separated path into its translation key and the language code it names. */
export function translationPath(path: string): TranslationPath {
  const parts = path.split('/');
  const name = parts.pop() ?? '';
  let locale: string | undefined;
  const kept: string[] = [];
  for (const p of parts) {
    const l = localeOf(p);
    if (l !== undefined) locale ??= l;
    else if (!TRANSLATION_FOLDERS.has(p.toLowerCase())) kept.push(p);
  }
  // README.fr.md, guide_ja.md, index-zh_CN.rst: a language code just before the extension.
  const m = /^(.+?)[._-]([a-z]{2}(?:[_-][A-Za-z]{2,4})?)(\.[^.]+)$/.exec(name);
  let base = name;
  if (m && localeOf(m[2]) !== undefined && m[2] !== m[1]) {
    locale ??= m[2];
    base = `${m[1]}${m[3]}`;
  }
  kept.push(base);
  return { key: kept.join('/'), locale };
}
