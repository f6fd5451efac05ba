import { test } from "node:test";
import assert from "node:assert/strict";
import { quoteFare, quoteBooking, UnknownRouteError, type FareTable, type FareRequest } from "../../src/ticketing/fareCalculator.js";

const table: FareTable = {
  year: 2025,
  islanderDiscountPercent: 40,
  returnDiscountPercent: 10,
  peakSupplementPence: 1200,
  bookingFeePence: 150,
  routes: {
    "mar-vel": {
      adult: 850,
      child: 425,
      senior: 600,
      perMetreOverSix: 700,
      vehicles: { car: 3200, van: 4100, campervan: 4800, commercial: 6500, motorcycle: 1400, bicycle: 0 },
    },
  },
};

const base: FareRequest = {
  routeId: "mar-vel",
  passengers: [{ type: "adult", count: 2 }],
  vehicle: "car",
  isReturn: false,
  isPeak: false,
  bookedDaysAhead: 30,
  islander: false,
};

test("a single crossing for two adults and a car adds up the table prices", () => {
  assert.equal(quoteFare(table, base).total, 850 * 2 + 3200);
});

test("islanders get forty per cent off passengers and vehicle", () => {
  const q = quoteFare(table, { ...base, islander: true });
  assert.equal(q.passengerFare, 1020);
  assert.equal(q.vehicleFare, 1920);
});

test("the peak supplement applies only to late car bookings on peak sailings", () => {
  assert.equal(quoteFare(table, { ...base, isPeak: true, bookedDaysAhead: 2 }).supplement, 1200);
  assert.equal(quoteFare(table, { ...base, isPeak: true, bookedDaysAhead: 10 }).supplement, 0);
  assert.equal(quoteFare(table, { ...base, isPeak: true, bookedDaysAhead: 2, vehicle: "commercial" }).supplement, 0);
});

test("long vehicles pay per extra metre over six", () => {
  const q = quoteFare(table, { ...base, passengers: [], vehicle: "campervan", vehicleLengthM: 7.4 });
  assert.equal(q.vehicleFare, 4800 + 2 * 700);
});

test("companions travel free", () => {
  const q = quoteFare(table, { ...base, vehicle: "none", passengers: [{ type: "companion", count: 1 }] });
  assert.equal(q.total, 0);
});

test("the booking fee is waived at the ticket office", () => {
  const online = quoteBooking(table, [base], "online");
  const office = quoteBooking(table, [base], "office");
  assert.equal(online - office, 150);
});

test("an unknown route is an error, not a free crossing", () => {
  assert.throws(() => quoteFare(table, { ...base, routeId: "nowhere" }), UnknownRouteError);
});
