// Type declarations for the two natural modules the tokenizer imports directly (importing the
// package root would pull in natural's database clients).
declare module 'natural/lib/natural/stemmers/porter_stemmer.js' {
  const PorterStemmer: { stem(token: string): string };
  export default PorterStemmer;
}
declare module 'natural/lib/natural/util/stopwords.js' {
  export const words: string[];
}
// Snowball stemmers of natural, one module per language (stemmers/porter_stemmer_<code>.js), and
// natural's stop-word lists for the same languages (util/stopwords_<code>.js).
declare module 'natural/lib/natural/stemmers/porter_stemmer_*' {
  const Stemmer: { stem(token: string): string };
  export default Stemmer;
}
declare module 'natural/lib/natural/util/stopwords_*' {
  export const words: string[];
}
declare module 'stopwords-iso' {
  const lists: Record<string, string[]>;
  export default lists;
}
