/**
 * Rare names (rareNames.ts). Texts: excerpts of the base64(1) manual page and the "base64
 * invocation" node of the GNU coreutils 9.1 Texinfo manual (Debian 12 coreutils 9.1-1, GFDL; the
 * same pair is in test/fixtures/lookalike-retellings), and of the strspn(3) page (Debian 12
 * manpages-dev 6.03-2). Expected shares are worked by hand from the formula in the header.
 */
import { describe, expect, it } from 'vitest';
import { namesOf, rareNameIndex } from '../../../src/core/lookalike/rareNames.js';

const man = `base64 - base64 encode/decode data and print to standard output
       -d, --decode
              decode data
       -i, --ignore-garbage
              when decoding, ignore non-alphabet characters
       -w, --wrap=COLS
              wrap encoded lines after COLS character (default 76).
       --help display this help and exit`;
const info = `‘-w COLS’
‘--wrap=COLS’
     During encoding, wrap lines after COLS characters.
‘-d’
‘--decode’
     Change the mode of operation, from the default of encoding data, to decoding data.
‘-i’
‘--ignore-garbage’
     When decoding, newlines are always accepted.`;
const strspn = `size_t strspn(const char *s, const char *accept);
The strspn() function calculates the length (in bytes) of the initial segment of s which consists
entirely of bytes in accept. See also strpbrk(3) and wcsspn(3) for the wide-character case; --help`;

describe('namesOf', () => {
  it('takes long options, snake_case and camelCase names, not short options, words or numbers', () => {
    expect(namesOf(man).sort()).toEqual(['--decode', '--help', '--ignore-garbage', '--wrap']);
    expect(namesOf(strspn).sort()).toEqual(['--help', 'size_t']);
    expect(namesOf('see fooBar and foo_bar. 76 non-alphabet')).toEqual(['foobar', 'foo_bar']);
  });
});

describe('rareNameIndex', () => {
  it('weighs the names both files hold by idf, over the geometric mean of their own weights', () => {
    const idx = rareNameIndex([man, info, strspn], 2);
    // --help is in 2 of 3 files (rare at maxDf 2, weight ln 1.5); --decode, --ignore-garbage, --wrap
    // in 2 (ln 1.5 each); size_t in 1 (ln 3). man: 4 × ln 1.5; info: 3 × ln 1.5; shared: 3 × ln 1.5.
    const l = Math.log(1.5);
    const p = idx.pair(0, 1);
    expect(p.shared).toBe(3);
    expect(p.share).toBeCloseTo((3 * l) / Math.sqrt(4 * l * 3 * l), 12);
    // man and strspn share only --help: ln 1.5 / sqrt(4 ln 1.5 × (ln 1.5 + ln 3)).
    expect(idx.pair(0, 2).share).toBeCloseTo(l / Math.sqrt(4 * l * (l + Math.log(3))), 12);
    expect(idx.pair(1, 2)).toEqual({ shared: 0, share: 0, own: [3, 2], devicesApart: false });
    expect(p.own).toEqual([4, 3]);
  });
  it('ignores names held by more than maxDf files', () => {
    const idx = rareNameIndex([man, info, strspn], 1);
    expect(idx.pair(0, 1)).toEqual({ shared: 0, share: 0, own: [0, 0], devicesApart: false });
  });
});

// Device-tree bindings and a driver page of Debian's linux-source-6.1 (GPL-2.0), excerpts:
// Documentation/devicetree/bindings/serial/arm,mps2-uart.txt, .../timer/arm,mps2-timer.txt,
// .../hwmon/adi,adm1275.yaml and Documentation/hwmon/adm1275.rst.
const uart = `- compatible	: Should be "arm,mps2-uart"
	compatible = "arm,mps2-uart";`;
const timer = `- compatible	: Should be "arm,mps2-timer"
	compatible = "arm,mps2-timer";`;
const binding = `$id: http://devicetree.org/schemas/hwmon/adi,adm1275.yaml#
      - adi,adm1275
      - adi,adm1075`;
const driverPage = `    Datasheet: www.analog.com/static/imported-files/data_sheets/ADM1275.pdf
refer to the Documentation/devicetree/bindings/hwmon/adi,adm1275.yaml for bindings`;

describe('device names', () => {
  it('takes vendor,model names (a digit or hyphen after the comma), not words joined by a comma', () => {
    expect(namesOf(uart)).toEqual(['arm,mps2-uart']);
    expect(namesOf(binding).sort()).toEqual(['adi,adm1075', 'adi,adm1275']);
    expect(namesOf('min(a,b) or red,green and 1,000 rows, {ok,complex1} [ok,port2], max(len,10)')).toEqual([]);
    // A model may start with digits (Documentation/devicetree/bindings/gpio/idt,32434-gpio.yaml).
    expect(namesOf('compatible = "idt,32434-gpio";')).toEqual(['idt,32434-gpio']);
  });

  it("leaves out a vendor's properties and references to binding files, which name no device", () => {
    // Excerpts of Documentation/devicetree/bindings/sound/realtek,rt5682s.yaml and rt5682.txt,
    // and of .../interrupt-controller/cdns,xtensa-mx.txt (linux-source-6.1, GPL-2.0).
    const schema = `properties:
  compatible:
    const: realtek,rt5682s
  realtek,jd-src:
    $ref: /schemas/types.yaml#/definitions/uint32
        realtek,ldo1-en-gpios = <&gpio 2 GPIO_ACTIVE_HIGH>;`;
    const text = `- compatible : "realtek,rt5682" or "realtek,rt5682i"
- realtek,jd-src : The JD source
- realtek,dmic-clk-rate-hz:`;
    const mx = `Binding for Xtensa MX interrupt distributor
Please refer to cdns,xtensa-pic.txt for the generic description
- compatible: "cdns,xtensa-mx"
$ref: /schemas/regulator/rohm,bd9576-regulator.yaml#`;
    expect(namesOf(schema)).toEqual(['realtek,rt5682s', 'gpio_active_high']);
    expect(namesOf(text).sort()).toEqual(['realtek,rt5682', 'realtek,rt5682i']);
    expect(namesOf(mx)).toEqual(['cdns,xtensa-mx']);
    // Sibling codecs that share only their vendor's properties name devices apart.
    expect(rareNameIndex([schema, text], 10).pair(0, 1).devicesApart).toBe(true);
  });

  it('marks two files that both name devices and share none apart, and leaves the shares to the other names', () => {
    const idx = rareNameIndex([uart, timer, binding, driverPage, man], 10);
    expect(idx.pair(0, 1).devicesApart).toBe(true);
    // The binding and its driver's page name the same device.
    expect(idx.pair(2, 3).devicesApart).toBe(false);
    // A file naming no device is never apart.
    expect(idx.pair(0, 4).devicesApart).toBe(false);
    // Device names are not counted among a file's names: data_sheets is the driver page's only one.
    expect(idx.pair(2, 3)).toMatchObject({ shared: 0, share: 0, own: [0, 1] });
  });
});
