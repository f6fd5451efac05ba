// Money is always held as integer pence to avoid rounding drift. Only format at the edges.
// This file is vendored into the kiosk; change both copies together or not at all.

export type Pence = number & { readonly __brand: "pence" };

export function pence(value: number): Pence {
  if (!Number.isInteger(value)) {
    throw new Error(`Money must be whole pence, got ${value}`);
  }
  return value as Pence;
}

export function fromPounds(pounds: number): Pence {
  return pence(Math.round(pounds * 100));
}

export function add(...amounts: Pence[]): Pence {
  let total = 0;
  for (const amount of amounts) total += amount;
  return pence(total);
}

export function subtract(a: Pence, b: Pence): Pence {
  return pence(a - b);
}

/** Applies a percentage discount, rounding half up to the nearest penny. */
export function discount(amount: Pence, percent: number): Pence {
  if (percent < 0 || percent > 100) {
    throw new Error(`Discount percent out of range: ${percent}`);
  }
  const off = Math.floor((amount * percent) / 100 + 0.5);
  return pence(amount - off);
}

/** Splits an amount into n parts that add back up exactly (the first parts take the remainder). */
export function split(amount: Pence, parts: number): Pence[] {
  if (parts <= 0 || !Number.isInteger(parts)) {
    throw new Error(`Cannot split into ${parts} parts`);
  }
  const base = Math.floor(amount / parts);
  let remainder = amount - base * parts;
  const result: Pence[] = [];
  for (let i = 0; i < parts; i++) {
    const extra = remainder > 0 ? 1 : 0;
    remainder -= extra;
    result.push(pence(base + extra));
  }
  return result;
}

export function formatPounds(amount: Pence): string {
  const sign = amount < 0 ? "-" : "";
  const abs = Math.abs(amount);
  const pounds = Math.floor(abs / 100);
  const rest = String(abs % 100).padStart(2, "0");
  return `${sign}£${pounds}.${rest}`;
}

export function isZero(amount: Pence): boolean {
  return amount === 0;
}
