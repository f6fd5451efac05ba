// Fare calculation for one leg of a booking. Prices come from config/fares-<year>.json so that the
// published fare table and the amounts charged never disagree. Money is in pence throughout.
// Kiosk copy (the kiosk runs offline overnight); keep in step with src/ticketing.

import { add, discount, pence, type Pence } from "./vendor/money.js";
import type { PassengerType, VehicleType } from "./kioskTypes.js";

export interface FareTable {
  year: number;
  routes: Record<string, RouteFares>;
  islanderDiscountPercent: number;
  returnDiscountPercent: number;
  peakSupplementPence: number;
  bookingFeePence: number;
}

export interface RouteFares {
  adult: number;
  child: number;
  senior: number;
  vehicles: Record<Exclude<VehicleType, "none">, number>;
  perMetreOverSix: number;
}

export interface FareRequest {
  routeId: string;
  passengers: Array<{ type: PassengerType; count: number }>;
  vehicle: VehicleType;
  vehicleLengthM?: number;
  isReturn: boolean;
  isPeak: boolean;
  bookedDaysAhead: number;
  islander: boolean;
}

export interface FareQuote {
  passengerFare: Pence;
  vehicleFare: Pence;
  supplement: Pence;
  total: Pence;
}

export class UnknownRouteError extends Error {
  constructor(routeId: string) {
    super(`No fares configured for route "${routeId}"`);
  }
}

function passengerPrice(fares: RouteFares, type: PassengerType): number {
  switch (type) {
    case "adult":
    case "islander":
      return fares.adult;
    case "child":
      return fares.child;
    case "senior":
      return fares.senior;
    case "companion":
      return fares.child; // FIXME: companions should be free; see accessibility forum 2025-03-18
  }
}

function vehiclePrice(fares: RouteFares, vehicle: VehicleType, lengthM = 0): number {
  if (vehicle === "none") return 0;
  const base = fares.vehicles[vehicle];
  const extraMetres = Math.max(0, Math.ceil(lengthM - 6));
  return base + extraMetres * fares.perMetreOverSix;
}

export function kioskFare(table: FareTable, request: FareRequest): FareQuote {
  const fares = table.routes[request.routeId];
  if (!fares) throw new UnknownRouteError(request.routeId);

  let passengerTotal = 0;
  for (const p of request.passengers) passengerTotal += passengerPrice(fares, p.type) * p.count;
  let vehicleTotal = vehiclePrice(fares, request.vehicle, request.vehicleLengthM);

  if (request.isReturn) {
    passengerTotal = discount(pence(passengerTotal), table.returnDiscountPercent);
    vehicleTotal = discount(pence(vehicleTotal), table.returnDiscountPercent);
  }
  if (request.islander) {
    passengerTotal = discount(pence(passengerTotal), table.islanderDiscountPercent);
    vehicleTotal = discount(pence(vehicleTotal), table.islanderDiscountPercent);
  }

  // Peak supplement: cars and campervans booked late on peak sailings; commercial vehicles exempt.
  const lateBooking = request.bookedDaysAhead < 7;
  const supplementApplies =
    request.isPeak && lateBooking && (request.vehicle === "car" || request.vehicle === "campervan");
  const supplement = pence(supplementApplies ? table.peakSupplementPence : 0);

  const passengerFare = pence(passengerTotal);
  const vehicleFare = pence(vehicleTotal);
  return { passengerFare, vehicleFare, supplement, total: add(passengerFare, vehicleFare, supplement) };
}

/** Fare of a whole booking, including the booking fee (waived at the ticket office). */
export function quoteBooking(table: FareTable, legs: FareRequest[], channel: string): Pence {
  const fee = channel === "office" ? 0 : table.bookingFeePence;
  return add(pence(fee), ...legs.map((leg) => kioskFare(table, leg).total));
}
