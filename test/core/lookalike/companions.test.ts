/**
 * Companion files (companions.ts). The paths are real ones: pairs the "same content, other words"
 * band listed before the companion rule on folders of Debian's linux-source-6.1
 * (sound/soc/codecs, fs, drivers/iio), python3-sklearn and python3-scipy (docs/overlaps.md), and
 * pairs of the same folders and of the Linux Documentation folder that must stay apart. The
 * naming conventions are the languages' common practice (from memory), not a published table.
 */
import { describe, expect, it } from 'vitest';
import { companionFiles } from '../../../src/core/lookalike/companions.js';

describe('companionFiles', () => {
  it('pairs a C source with its header of the same name, in either order and across folders', () => {
    expect(companionFiles('rt5663.c', 'rt5663.h')).toBe(true);
    expect(companionFiles('dac/ad5686.h', 'dac/ad5686.c')).toBe(true);
    expect(companionFiles('smb/client/nterr.c', 'smb/client/nterr.h')).toBe(true);
    expect(companionFiles('drivers/foo/bar.c', 'include/linux/bar.h')).toBe(true);
    expect(companionFiles('src/Widget.cpp', 'include/widget.hpp')).toBe(true);
  });

  it('pairs other interface and implementation files: OCaml, Ada, Python stubs, TypeScript declarations', () => {
    expect(companionFiles('lib/parser.ml', 'lib/parser.mli')).toBe(true);
    expect(companionFiles('src/queue.adb', 'src/queue.ads')).toBe(true);
    expect(companionFiles('pkg/_core.py', 'pkg/_core.pyi')).toBe(true);
    expect(companionFiles('dist/index.js', 'dist/index.d.ts')).toBe(true);
    expect(companionFiles('types/map.d.mts', 'src/map.mts')).toBe(true);
  });

  it('pairs a test with the file it tests, by affix or by test folder', () => {
    expect(companionFiles('utils/_arpack.py', 'utils/tests/test_arpack.py')).toBe(true);
    expect(companionFiles('src/core/map/layoutFrame.ts', 'test/core/map/layoutFrame.test.ts')).toBe(true);
    expect(companionFiles('lib/walk.js', 'lib/walk.spec.js')).toBe(true);
    expect(companionFiles('cmd/serve.go', 'cmd/serve_test.go')).toBe(true);
    expect(companionFiles('src/main/java/Ledger.java', 'src/test/java/LedgerTest.java')).toBe(true);
    expect(companionFiles('src/ledger.rs', 'tests/ledger.rs')).toBe(true);
  });

  it('keeps apart files that only look alike by name: siblings, two tests, two headers, documentation', () => {
    // Sibling drivers of one chip for two buses, two headers of sibling codecs (drivers/iio, sound/soc/codecs).
    expect(companionFiles('pressure/zpa2326_i2c.c', 'pressure/zpa2326_spi.c')).toBe(false);
    expect(companionFiles('wm8983.h', 'wm8985.h')).toBe(false);
    // A private module and its public shim are one name twice in one language, not an interface (python3-scipy).
    expect(companionFiles('constants/_constants.py', 'constants/constants.py')).toBe(false);
    // Two tests of one name, and two declaration files.
    expect(companionFiles('test/walk.test.ts', 'spec/walk.spec.ts')).toBe(false);
    expect(companionFiles('a/index.d.ts', 'b/index.d.ts')).toBe(false);
    // Documentation: a binding and its driver page, a page and its translation (Linux Documentation).
    expect(companionFiles('devicetree/bindings/hwmon/lm75.yaml', 'hwmon/lm75.rst')).toBe(false);
    expect(companionFiles('core-api/kref.rst', 'translations/zh_CN/core-api/kref.rst')).toBe(false);
    // Words that merely end in "test" or start with "Test" are no test affix.
    expect(companionFiles('net/contest.c', 'net/con.c')).toBe(false);
    expect(companionFiles('app/Testament.java', 'app/Ament.java')).toBe(false);
  });
});
