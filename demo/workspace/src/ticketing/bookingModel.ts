// Bookings, tickets and their store. A booking belongs to one customer and holds one or more legs;
// each leg is a seat (and optionally vehicle space) on one sailing.

import type { Pence } from "../shared/money.js";

export type PassengerType = "adult" | "child" | "senior" | "islander" | "companion";

export type VehicleType = "none" | "car" | "van" | "campervan" | "commercial" | "motorcycle" | "bicycle";

export type PaymentMethod = "card" | "cash" | "voucher" | "account";

export type LegStatus = "booked" | "travelled" | "transferred" | "cancelled" | "refunded";

export interface Leg {
  sailingId: string;
  passengers: Array<{ type: PassengerType; count: number }>;
  vehicle: VehicleType;
  vehicleLengthM?: number;
  farePaid: Pence;
  status: LegStatus;
}

export interface Booking {
  reference: string;
  customerEmail?: string;
  customerPhone?: string;
  createdAt: Date;
  channel: "online" | "kiosk" | "office" | "onboard";
  payment: PaymentMethod;
  paymentRef?: string;
  bookingFee: Pence;
  legs: Leg[];
}

export interface BookingStore {
  get(reference: string): Promise<Booking | undefined>;
  save(booking: Booking): Promise<void>;
  onSailing(sailingId: string): Promise<Booking[]>;
}

export class InMemoryBookingStore implements BookingStore {
  private readonly bookings = new Map<string, Booking>();

  async get(reference: string): Promise<Booking | undefined> {
    return this.bookings.get(reference);
  }

  async save(booking: Booking): Promise<void> {
    this.bookings.set(booking.reference, structuredClone(booking));
  }

  async onSailing(sailingId: string): Promise<Booking[]> {
    return [...this.bookings.values()].filter((b) => b.legs.some((l) => l.sailingId === sailingId));
  }
}

const ALPHABET = "ABCDEFGHJKLMNPQRSTUVWXYZ23456789";

/** Booking references avoid 0/O and 1/I so they can be read out over the phone. */
export function newReference(random: () => number = Math.random): string {
  let ref = "OS-";
  for (let i = 0; i < 6; i++) ref += ALPHABET[Math.floor(random() * ALPHABET.length)];
  return ref;
}

export function activeLegs(booking: Booking): Leg[] {
  return booking.legs.filter((l) => l.status === "booked");
}

export function isReturn(booking: Booking): boolean {
  return booking.legs.length === 2;
}
