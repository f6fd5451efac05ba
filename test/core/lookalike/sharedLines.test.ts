import { describe, expect, it } from 'vitest';
import { lineCounts, nonBlankLineCount, sharedLineCount } from '../../../src/core/lookalike/sharedLines.js';

// Expected counts worked out by hand from the definition in sharedLines.ts.
describe('sharedLineCount', () => {
  it('counts identical trimmed non-blank lines, repeats included', () => {
    const a = 'import x\n\n  return 1;\n}\n}\nonly in a\r\n';
    const b = '\timport x  \nreturn 1;\n}\nonly in b\n\n\n';
    // shared: "import x", "return 1;", "}" once (a has it twice, b once) → 3
    expect(sharedLineCount(lineCounts(a), lineCounts(b))).toBe(3);
    expect(sharedLineCount(lineCounts(b), lineCounts(a))).toBe(3);
  });

  it('gives a file its own non-blank line count against itself', () => {
    const a = 'x\n\ny\nx\n   \n';
    expect(sharedLineCount(lineCounts(a), lineCounts(a))).toBe(3);
    expect(nonBlankLineCount(lineCounts(a))).toBe(3);
  });

  it('is zero for empty texts', () => {
    expect(sharedLineCount(lineCounts(''), lineCounts('a\nb'))).toBe(0);
  });
});
