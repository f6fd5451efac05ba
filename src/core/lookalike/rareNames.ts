/**
 * Shared rare names: how much of two files' rare identifiers they hold in common.
 *
 * A retelling of a program or an interface repeats its specific names — its long options
 * (`--ignore-garbage`), its identifiers (`snake_case`, `camelCase`) — while a neighbour of the same
 * area shares the area's words but other names. Names are taken from the raw text (no stemming),
 * lowercased; a name is rare when at most `maxDf` files hold it. Each rare name weighs its idf,
 * ln(n / df) (Spärck Jones 1972); the pair's share is the weight of the names both files hold over
 * the geometric mean of each file's own rare-name weight (a cosine over binary idf-weighted name
 * sets, Salton & Buckley 1988). Bare numbers are not names: the code tables of one family of
 * pages (character sets) share them without telling the same thing. Device names (`ti,tmp108`)
 * are kept apart: they only veto a pair whose files both name devices and share none.
 */

/**
 * Long options, snake_case and camelCase identifiers, and vendor-prefixed device names
 * (`ti,tmp108`, `cdns,xtensa-pic`: the "vendor,model" form of device-tree compatible strings, as
 * the Devicetree Specification writes them, from memory; a model has a digit or hyphen after a
 * letter, or starts with digits followed by a letter or hyphen (`idt,32434-gpio`), so a word list
 * written without spaces is not one, nor a pair of code arguments such as `len,10`; and not right
 * after a brace or bracket, so a term of code such as Erlang's `{ok,port1}` is not one either).
 * The same form names a vendor's properties (`realtek,jd-src = <1>;`, `realtek,jd-src:` as a
 * schema's key) and the binding files (`cdns,xtensa-pic.txt`, `$ref: rohm,bd9576-regulator.yaml#`):
 * a name followed by `=` or `:`, or by `.txt` or `.yaml`, is neither a device a file names nor any
 * other name, so two bindings of sibling devices that share a vendor's properties, or where one
 * points to the other's file, stay apart.
 */
const NAME =
  /(?<![\w-])--[A-Za-z][\w-]*|\b[A-Za-z]+_\w+|\b[a-z]+[A-Z]\w*|(?<![{([])\b[a-z][a-z0-9]+,(?:[a-z][a-z0-9]*[-0-9]|[0-9]+[a-z-])[\w-]*(?![\w-])(?![ \t]*[:=]|\.(?:ya?ml|txt)\b)/g;

/** The distinct names of a text, lowercased, trailing dots and hyphens dropped. */
export function namesOf(text: string): string[] {
  const out = new Set<string>();
  for (const m of text.matchAll(NAME)) out.add(m[0].toLowerCase().replace(/[.-]+$/, ''));
  return [...out];
}

export interface RareNames {
  /** Rare names both files hold. */
  readonly shared: number;
  /** Their idf weight over the geometric mean of each file's rare-name weight (0 when either has none). */
  readonly share: number;
  /** Rare names each file holds (a's, b's); device names are not counted. */
  readonly own: readonly [number, number];
  /** Both files name devices (rare `vendor,model` names) and share none of them. */
  readonly devicesApart?: boolean;
}

export interface RareNameIndex {
  /** Shared rare names of files a and b (positions in the list given to rareNameIndex). */
  readonly pair: (a: number, b: number) => RareNames;
}

/** True for a vendor-prefixed device name (`ti,tmp108`): the one kind of name with a comma. */
function isDeviceName(name: string): boolean {
  return name.includes(',');
}

/**
 * Name sets of the files, their document frequencies, and a pair scorer. Device names
 * (`vendor,model`) stay out of the shares and counts, which the other names make as before; they
 * only tell apart two files that both name devices and share none of them (`devicesApart`): two
 * bindings of sibling devices each name their own, where a device's binding and the page about its
 * driver name the same one (or the page names none).
 */
export function rareNameIndex(texts: readonly string[], maxDf: number): RareNameIndex {
  const n = texts.length;
  const sets = texts.map(namesOf);
  const df = new Map<string, number>();
  for (const s of sets) for (const w of s) df.set(w, (df.get(w) ?? 0) + 1);
  const weight = (w: string): number => {
    const d = df.get(w) ?? 0;
    return d > 0 && d <= maxDf ? Math.log(n / d) : 0;
  };
  const rareOf = (s: string[], devices: boolean) =>
    new Map(s.filter((w) => isDeviceName(w) === devices && weight(w) > 0).map((w) => [w, weight(w)]));
  const rare = sets.map((s) => rareOf(s, false));
  const devices = sets.map((s) => new Set(rareOf(s, true).keys()));
  const total = rare.map((m) => [...m.values()].reduce((x, y) => x + y, 0));
  return {
    pair(a, b) {
      const [small, big] = rare[a].size <= rare[b].size ? [rare[a], rare[b]] : [rare[b], rare[a]];
      let shared = 0;
      let w = 0;
      for (const [name, x] of small) {
        if (!big.has(name)) continue;
        shared++;
        w += x;
      }
      const d = Math.sqrt(total[a] * total[b]);
      let devicesApart = devices[a].size > 0 && devices[b].size > 0;
      for (const name of devices[a]) if (devices[b].has(name)) devicesApart = false;
      return { shared, share: d > 0 ? w / d : 0, own: [rare[a].size, rare[b].size], devicesApart };
    },
  };
}
