// HTTP routes for bookings and refunds.

import type { Router } from "../shared/http.js";
import { ok, badRequest } from "../shared/http.js";
import type { BookingStore } from "./bookingModel.js";
import { activeLegs } from "./bookingModel.js";
import type { RefundService, RefundReason } from "./refundService.js";
import { customerCancellationAmount } from "./refundService.js";
import { formatPounds } from "../shared/money.js";

const CANCELLATION_REASONS: RefundReason[] = ["weather", "tide", "technical", "crew"];

export function registerTicketRoutes(router: Router, bookings: BookingStore, refunds: RefundService): void {
  router.add("GET", "/bookings/:reference", async (req) => {
    const booking = await bookings.get(req.params.reference);
    if (!booking) return { status: 404, body: { error: "no such booking" } };
    return ok({
      reference: booking.reference,
      legs: booking.legs.map((l) => ({ sailing: l.sailingId, status: l.status, fare: formatPounds(l.farePaid) })),
    });
  });

  // Operations marks a sailing as cancelled; every booking on it gets a pending refund, so every
  // passenger is reimbursed without having to claim.
  router.add("POST", "/sailings/:id/cancel", async (req) => {
    const reason = (req.body as { reason?: RefundReason } | undefined)?.reason;
    if (!reason || !CANCELLATION_REASONS.includes(reason)) {
      return badRequest(`reason must be one of ${CANCELLATION_REASONS.join(", ")}`);
    }
    const queued = await refunds.refundAllForSailing(req.params.id, reason);
    return ok({ sailing: req.params.id, refundsQueued: queued });
  });

  // The customer cancels their own leg: quote what they would get back under the policy.
  router.add("GET", "/bookings/:reference/cancellation-quote", async (req) => {
    const booking = await bookings.get(req.params.reference);
    if (!booking) return { status: 404, body: { error: "no such booking" } };
    const hours = Number(req.query.get("hoursBefore") ?? "NaN");
    if (!Number.isFinite(hours)) return badRequest("hoursBefore is required");
    return ok(
      activeLegs(booking).map((leg) => ({
        sailing: leg.sailingId,
        refund: formatPounds(customerCancellationAmount(leg, hours)),
      })),
    );
  });

  // Customer transferred to another sailing instead of taking the refund.
  router.add("POST", "/bookings/:reference/transfer", async (req) => {
    const body = req.body as { fromSailing?: string; toSailing?: string } | undefined;
    if (!body?.fromSailing || !body.toSailing) return badRequest("fromSailing and toSailing are required");
    const booking = await bookings.get(req.params.reference);
    if (!booking) return { status: 404, body: { error: "no such booking" } };
    const leg = booking.legs.find((l) => l.sailingId === body.fromSailing);
    if (!leg) return badRequest("booking has no leg on that sailing");
    leg.status = "transferred";
    booking.legs.push({ ...leg, sailingId: body.toSailing, status: "booked" });
    await bookings.save(booking);
    const withdrawn = await refunds.withdrawForTransfer(booking.reference, body.fromSailing);
    return ok({ transferred: true, pendingRefundWithdrawn: withdrawn });
  });
}
