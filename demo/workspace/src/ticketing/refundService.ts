// Refund queue and amounts: who is reimbursed, how much, and how. Policy: notes/ticketing/refund-policy.md.
// Procedure for staff: notes/ticketing/runbook-issuing-refunds.md.

import type { Booking, BookingStore, Leg } from "./bookingModel.js";
import { add, discount, pence, subtract, type Pence } from "../shared/money.js";
import type { Logger } from "../shared/logger.js";

export type RefundReason = "weather" | "tide" | "technical" | "crew" | "customer" | "delay" | "payment-fault";

export type RefundState = "pending" | "approved" | "paid" | "failed" | "withdrawn";

export interface Refund {
  id: string;
  bookingReference: string;
  sailingId: string;
  amount: Pence;
  reason: RefundReason;
  state: RefundState;
  method: "card" | "bank-transfer" | "cash" | "voucher";
  createdAt: Date;
  note?: string;
}

export interface RefundStore {
  add(refund: Refund): Promise<void>;
  update(id: string, changes: Partial<Refund>): Promise<void>;
  forBooking(reference: string): Promise<Refund[]>;
  pending(): Promise<Refund[]>;
}

export class InMemoryRefundStore implements RefundStore {
  private readonly refunds = new Map<string, Refund>();
  async add(refund: Refund) {
    this.refunds.set(refund.id, refund);
  }
  async update(id: string, changes: Partial<Refund>) {
    const existing = this.refunds.get(id);
    if (existing) this.refunds.set(id, { ...existing, ...changes });
  }
  async forBooking(reference: string) {
    return [...this.refunds.values()].filter((r) => r.bookingReference === reference);
  }
  async pending() {
    return [...this.refunds.values()].filter((r) => r.state === "pending");
  }
}

export const ADMIN_FEE: Pence = pence(300);

/** Amount owed for one leg when the passenger cancels, given hours before departure. */
export function customerCancellationAmount(leg: Leg, hoursBeforeDeparture: number): Pence {
  if (hoursBeforeDeparture > 48) return pence(Math.max(0, leg.farePaid - ADMIN_FEE));
  if (hoursBeforeDeparture > 2) return discount(leg.farePaid, 50);
  return pence(0);
}

function refundMethod(booking: Booking): Refund["method"] {
  switch (booking.payment) {
    case "card":
      return "card";
    case "voucher":
      return "voucher";
    case "cash":
    case "account":
      return "bank-transfer";
  }
}

export class RefundService {
  private counter = 0;

  constructor(
    private readonly bookings: BookingStore,
    private readonly refunds: RefundStore,
    private readonly log: Logger,
    private readonly now: () => Date = () => new Date(),
  ) {}

  /** Queues a full refund per active leg on a sailing; transferred legs are skipped. Returns the count. */
  async refundAllForSailing(sailingId: string, reason: RefundReason): Promise<number> {
    const affected = await this.bookings.onSailing(sailingId);
    let queued = 0;
    for (const booking of affected) {
      const leg = booking.legs.find((l) => l.sailingId === sailingId && l.status === "booked");
      if (!leg) continue;
      const existing = await this.refunds.forBooking(booking.reference);
      if (existing.some((r) => r.sailingId === sailingId && r.state !== "withdrawn")) continue;
      const feeShare = booking.legs.length > 0 ? Math.floor(booking.bookingFee / booking.legs.length) : 0;
      await this.refunds.add({
        id: `RF-${++this.counter}`,
        bookingReference: booking.reference,
        sailingId,
        amount: add(leg.farePaid, pence(feeShare)),
        reason,
        state: "pending",
        method: refundMethod(booking),
        createdAt: this.now(),
      });
      leg.status = "cancelled";
      await this.bookings.save(booking);
      queued++;
    }
    this.log.info("refunds queued for cancelled sailing", { sailingId, reason, queued });
    return queued;
  }

  /** Withdraws the pending refund of a leg that was transferred, so it is not paid twice. */
  async withdrawForTransfer(bookingReference: string, sailingId: string): Promise<boolean> {
    const refunds = await this.refunds.forBooking(bookingReference);
    const pending = refunds.find((r) => r.sailingId === sailingId && r.state === "pending");
    if (!pending) return false;
    await this.refunds.update(pending.id, { state: "withdrawn", note: "customer chose alternative" });
    return true;
  }

  /** Travel credit instead of a refund: 110% of the amount, as a voucher. */
  creditInsteadOfRefund(refund: Refund): Pence {
    const bonus = Math.round(refund.amount * 0.1);
    return add(refund.amount, pence(bonus));
  }

  /** Reimburses an overnight stay (capped), e.g. after the last sailing of the day was cancelled. */
  async accommodationClaim(bookingReference: string, sailingId: string, receiptPence: Pence): Promise<Refund> {
    const limit = pence(8000);
    const amount = receiptPence > limit ? limit : receiptPence;
    const refund: Refund = {
      id: `RF-${++this.counter}`,
      bookingReference,
      sailingId,
      amount,
      reason: "weather",
      state: amount < receiptPence ? "pending" : "approved",
      method: "bank-transfer",
      createdAt: this.now(),
      note: amount < receiptPence ? `claim over limit by ${subtract(receiptPence, limit)}p; manager review` : undefined,
    };
    await this.refunds.add(refund);
    return refund;
  }
}

/** Month-end export for the finance officer: one CSV line per paid item, for reconciliation with the card processor. */
export function toFinanceCsv(items: Refund[]): string {
  const header = "date,reference,booking,amount_pence,method,reason";
  const lines = items
    .filter((r) => r.state === "paid")
    .sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime())
    .map((r) => [r.createdAt.toISOString().slice(0, 10), r.id, r.bookingReference, String(r.amount), r.method, r.reason].join(","));
  return [header, ...lines].join("\n");
}

/** Totals per payment method, as shown on the finance dashboard. */
export function totalsByMethod(items: Refund[]): Record<Refund["method"], number> {
  const totals: Record<Refund["method"], number> = { card: 0, "bank-transfer": 0, cash: 0, voucher: 0 };
  for (const r of items) {
    if (r.state === "paid") totals[r.method] += r.amount;
  }
  return totals;
}
