// Travel vouchers and credits. Vouchers are issued as gifts, as goodwill after complaints, or as
// travel credit chosen instead of a refund when a sailing is cancelled (worth 110% of the fare).

import { pence, subtract, type Pence } from "../shared/money.js";
import { addDays } from "../shared/dates.js";

export type VoucherOrigin = "purchase" | "goodwill" | "cancellation-credit";

export interface Voucher {
  code: string;
  origin: VoucherOrigin;
  issuedAt: Date;
  expiresAt: Date;
  initialValue: Pence;
  balance: Pence;
  bookingReference?: string;
}

export class VoucherError extends Error {}

const VALIDITY_DAYS: Record<VoucherOrigin, number> = {
  purchase: 730,
  goodwill: 365,
  "cancellation-credit": 365,
};

export class VoucherBook {
  private readonly vouchers = new Map<string, Voucher>();
  private sequence = 1000;

  constructor(private readonly now: () => Date = () => new Date()) {}

  issue(value: Pence, origin: VoucherOrigin, bookingReference?: string): Voucher {
    if (value <= 0) throw new VoucherError("A voucher must have a positive value");
    const issuedAt = this.now();
    const voucher: Voucher = {
      code: `TC${++this.sequence}`,
      origin,
      issuedAt,
      expiresAt: addDays(issuedAt, VALIDITY_DAYS[origin]),
      initialValue: value,
      balance: value,
      bookingReference,
    };
    this.vouchers.set(voucher.code, voucher);
    return voucher;
  }

  balance(code: string): Pence {
    return this.require(code).balance;
  }

  /** Spends up to `amount` from the voucher; returns what is still to pay by other means. */
  redeem(code: string, amount: Pence): Pence {
    const voucher = this.require(code);
    if (voucher.expiresAt.getTime() < this.now().getTime()) {
      throw new VoucherError(`Voucher ${code} expired on ${voucher.expiresAt.toISOString().slice(0, 10)}`);
    }
    const used = amount < voucher.balance ? amount : voucher.balance;
    voucher.balance = subtract(voucher.balance, used);
    return subtract(amount, used);
  }

  /** A booking paid by voucher that is refunded is reimbursed onto a voucher, never in cash. */
  restore(code: string, amount: Pence): void {
    const voucher = this.require(code);
    voucher.balance = pence(voucher.balance + amount);
    const minimumExpiry = addDays(this.now(), 90);
    if (voucher.expiresAt < minimumExpiry) voucher.expiresAt = minimumExpiry;
  }

  expiringWithin(days: number): Voucher[] {
    const limit = addDays(this.now(), days).getTime();
    return [...this.vouchers.values()].filter((v) => v.balance > 0 && v.expiresAt.getTime() <= limit);
  }

  private require(code: string): Voucher {
    const voucher = this.vouchers.get(code.toUpperCase());
    if (!voucher) throw new VoucherError(`Unknown voucher code ${code}`);
    return voucher;
  }
}
