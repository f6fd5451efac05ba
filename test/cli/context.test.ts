/** Option parsing shared by the commands (src/cli/context.ts): the settings a user can give. */
import { describe, expect, it } from 'vitest';
import { settingsFrom } from '../../src/cli/context.js';
import { InvalidInputError } from '../../src/core/errors.js';

describe('settingsFrom', () => {
  it('reads --power-iterations into the index settings (to match a cluster model that settled in more steps)', () => {
    expect(settingsFrom({ 'power-iterations': '25', k: '60', seed: '7' })).toEqual({ powerIterations: 25, k: 60, seed: 7 });
    expect(settingsFrom({})).toEqual({});
  });

  it('refuses a power-iteration count that is not a positive whole number, naming the option', () => {
    for (const bad of ['0', '-3', '2.5', 'many']) {
      expect(() => settingsFrom({ 'power-iterations': bad })).toThrow(InvalidInputError);
      expect(() => settingsFrom({ 'power-iterations': bad })).toThrow(/--power-iterations/);
    }
  });
});
