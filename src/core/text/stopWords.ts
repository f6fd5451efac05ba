/**
 * Stop words: natural's English list (170 words) plus keywords and filler identifiers common to
 * popular programming languages (our own list, common practice: keywords carry syntax, not topic).
 */
import { words as englishStopWords } from 'natural/lib/natural/util/stopwords.js';

const PROGRAMMING_KEYWORDS = `
abstract and as assert async await auto bool boolean break byte case catch char class const constructor
continue def default defer del delete do double elif else enum export extends extern false final finally
float fn for from func function get go goto if impl implements import in instanceof int interface is let
long match mod module mut namespace new nil none not null object of or package pass private protected pub
public raise readonly ref return self set short signed static str string struct super switch this throw
throws trait true try type typedef typeof uint undefined union unsigned use using var void volatile where
while with yield
args arg argv len val tmp obj ptr err ctx cfg opts idx num ret res req src dst buf str
`;

const EXTRA_ENGLISH = `also may might must shall will would could should can cannot i.e e.g etc us we our ours you your
yours he him his she her hers it its they them their theirs what which who whom whose this that these those`;

/** natural's English list alone (language detection compares it with the other languages' lists). */
export const ENGLISH_STOP_WORDS: ReadonlySet<string> = new Set(englishStopWords);

/** Every stop word, lowercase. */
export const STOP_WORDS: ReadonlySet<string> = new Set(
  [...englishStopWords, ...PROGRAMMING_KEYWORDS.split(/\s+/), ...EXTRA_ENGLISH.split(/\s+/)].filter((w) => w.length > 0),
);
