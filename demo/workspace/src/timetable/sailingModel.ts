// Core timetable types. A route is a fixed pair of berths; a sailing is one dated crossing of a
// route by one vessel. Keep these free of behaviour so they can be shared with the kiosk.

export type BerthId = "marrowick" | "vellick" | "orrinsay" | "tarnay";

export type VesselId = "sule-lass" | "kittiwake-dawn" | "brannagh";

export interface Berth {
  id: BerthId;
  name: string;
  /** Depth of the berth below chart datum in metres; negative when the berth dries. */
  chartedDepthM: number;
  /** Minimum water to keep under the keel while alongside. */
  minUnderKeelM: number;
  /** Minutes needed to come alongside, unload, load and leave. */
  turnaroundMinutes: number;
  /** Tide station whose predictions apply to this berth. */
  tideStation: string;
  /** Deep-water berths can be used at any state of tide and skip the window check. */
  allStatesOfTide: boolean;
}

export interface Vessel {
  id: VesselId;
  name: string;
  loadedDraughtM: number;
  serviceSpeedKnots: number;
  vehicleLanes: number;
  passengerCapacity: number;
}

export interface Route {
  id: string;
  from: BerthId;
  to: BerthId;
  summerCrossingMinutes: number;
  winterCrossingMinutes: number;
}

export type SailingStatus = "scheduled" | "tide-critical" | "delayed" | "cancelled";

export interface Sailing {
  id: string;
  routeId: string;
  vesselId: VesselId;
  departure: Date;
  arrival: Date;
  status: SailingStatus;
  /** Free text shown to passengers when the status is not "scheduled". */
  notice?: string;
}

export interface DroppedSailing {
  routeId: string;
  preferredDeparture: Date;
  reason: string;
}

export interface GeneratedTimetable {
  sailings: Sailing[];
  dropped: DroppedSailing[];
  warnings: string[];
}

export function sailingId(routeId: string, departure: Date): string {
  return `${routeId}@${departure.toISOString().slice(0, 16)}`;
}

export function isWinter(date: Date): boolean {
  const month = date.getUTCMonth();
  return month >= 9 || month <= 2;
}

export function crossingMinutes(route: Route, date: Date): number {
  return isWinter(date) ? route.winterCrossingMinutes : route.summerCrossingMinutes;
}
