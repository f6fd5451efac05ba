// Type declarations for the two natural modules the tokenizer imports directly (importing the
// package root would pull in natural's database clients).
declare module 'natural/lib/natural/stemmers/porter_stemmer.js' {
  const PorterStemmer: { stem(token: string): string };
  export default PorterStemmer;
}
declare module 'natural/lib/natural/util/stopwords.js' {
  export const words: string[];
}
