import { test } from "node:test";
import assert from "node:assert/strict";
import { RefundService, InMemoryRefundStore, customerCancellationAmount } from "../../src/ticketing/refundService.js";
import { InMemoryBookingStore, type Booking } from "../../src/ticketing/bookingModel.js";
import { createLogger, MemorySink } from "../../src/shared/logger.js";
import { pence } from "../../src/shared/money.js";

function booking(reference: string, legs: Booking["legs"], payment: Booking["payment"] = "card"): Booking {
  return {
    reference,
    createdAt: new Date("2025-02-01T10:00Z"),
    channel: "online",
    payment,
    bookingFee: pence(100),
    legs,
  };
}

const leg = (sailingId: string, fare: number, status: Booking["legs"][number]["status"] = "booked") => ({
  sailingId,
  passengers: [{ type: "adult" as const, count: 1 }],
  vehicle: "car" as const,
  farePaid: pence(fare),
  status,
});

async function setup() {
  const bookings = new InMemoryBookingStore();
  const refunds = new InMemoryRefundStore();
  const sink = new MemorySink();
  const service = new RefundService(bookings, refunds, createLogger(sink), () => new Date("2025-02-25T08:00Z"));
  return { bookings, refunds, sink, service };
}

test("a cancelled sailing queues one full refund per booked leg, reimbursing fare and fee", async () => {
  const { bookings, refunds, service } = await setup();
  await bookings.save(booking("OS-AAAAAA", [leg("mar-orr@2025-02-25T07:30", 4200)]));
  await bookings.save(booking("OS-BBBBBB", [leg("mar-orr@2025-02-25T07:30", 1800)], "cash"));
  const queued = await service.refundAllForSailing("mar-orr@2025-02-25T07:30", "weather");
  assert.equal(queued, 2);
  const pending = await refunds.pending();
  assert.deepEqual(pending.map((r) => r.amount).sort(), [1900, 4300]);
  assert.equal(pending.find((r) => r.bookingReference === "OS-BBBBBB")?.method, "bank-transfer");
});

test("return tickets are refunded for the cancelled leg only; the other leg is not reimbursed", async () => {
  const { bookings, refunds, service } = await setup();
  await bookings.save(booking("OS-CCCCCC", [leg("out", 2000), leg("back", 2000)]));
  await service.refundAllForSailing("back", "tide");
  const [refund] = await refunds.pending();
  assert.equal(refund.amount, 2050);
});

test("transferred legs are not refunded and a later transfer withdraws the refund", async () => {
  const { bookings, refunds, service } = await setup();
  await bookings.save(booking("OS-DDDDDD", [leg("s1", 3000, "transferred")]));
  await bookings.save(booking("OS-EEEEEE", [leg("s1", 3000)]));
  assert.equal(await service.refundAllForSailing("s1", "crew"), 1);
  assert.equal(await service.withdrawForTransfer("OS-EEEEEE", "s1"), true);
  assert.equal((await refunds.pending()).length, 0);
});

test("queuing twice for the same sailing does not pay twice", async () => {
  const { bookings, service } = await setup();
  await bookings.save(booking("OS-FFFFFF", [leg("s2", 1500)]));
  await service.refundAllForSailing("s2", "weather");
  assert.equal(await service.refundAllForSailing("s2", "weather"), 0);
});

test("passenger cancellations follow the notice periods in the policy", () => {
  const l = leg("s3", 2000);
  assert.equal(customerCancellationAmount(l, 72), 1700);
  assert.equal(customerCancellationAmount(l, 24), 1000);
  assert.equal(customerCancellationAmount(l, 1), 0);
});

test("accommodation claims above the limit are capped and sent for review", async () => {
  const { service } = await setup();
  const claim = await service.accommodationClaim("OS-GGGGGG", "s4", pence(9500));
  assert.equal(claim.amount, 8000);
  assert.equal(claim.state, "pending");
});
