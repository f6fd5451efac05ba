import { describe, expect, it } from 'vitest';
import { contentHash, isBlankText, normaliseForHash } from '../../../src/core/lookalike/contentHash.js';

// Behaviour follows the normalisation rules stated in contentHash.ts (our own design; common practice).
describe('contentHash', () => {
  it('ignores line-ending style, a byte-order mark, trailing spaces and outer blank lines', () => {
    const plain = 'export const a = 1;\n\nfunction f() {\n  return a;\n}';
    expect(contentHash('\ufeff' + plain.replace(/\n/g, '\r\n'))).toBe(contentHash(plain));
    expect(contentHash(plain.replace(/\n/g, '\r'))).toBe(contentHash(plain));
    expect(contentHash(`\n\n${plain.replace(/;$/gm, ';   \t')}\n\n`)).toBe(contentHash(plain));
  });

  it('treats composed and decomposed accents as the same text (NFC)', () => {
    expect(contentHash('caf\u00e9 menu')).toBe(contentHash('cafe\u0301 menu'));
  });

  it('keeps indentation, inner blank lines and case significant', () => {
    const base = 'a\n  b\nc';
    expect(contentHash('a\n    b\nc')).not.toBe(contentHash(base));
    expect(contentHash('a\n\n  b\nc')).not.toBe(contentHash(base));
    expect(contentHash('A\n  b\nc')).not.toBe(contentHash(base));
  });

  it('is 128 bits of hex and differs for one changed character', () => {
    const h = contentHash('the reading room opens at nine');
    expect(h).toMatch(/^[0-9a-f]{32}$/);
    expect(contentHash('the reading room opens at nine!')).not.toBe(h);
  });

  it('normalises only what its rules name', () => {
    expect(normaliseForHash('\r\n x  \r\n\r\ny\t\r\n\r\n')).toBe(' x\n\ny');
  });

  it('calls whitespace-only texts blank and anything else not', () => {
    expect(isBlankText('')).toBe(true);
    expect(isBlankText(' \n\t\r\n')).toBe(true);
    expect(isBlankText('\ufeff\n')).toBe(true);
    expect(isBlankText('\n}\n')).toBe(false);
  });
});
