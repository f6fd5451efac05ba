// Types for passenger assistance. An assistance request belongs to a booking and a sailing and says
// what help the passenger needs, in categories we can plan for plus their own words.

import type { Berth } from "../timetable/sailingModel.js";
import type { TideTable } from "../timetable/tideTable.js";

export type NeedKind =
  | "wheelchair-manual"
  | "wheelchair-powered"
  | "mobility-scooter"
  | "walking-aid"
  | "sight-loss"
  | "hearing-loss"
  | "assistance-dog"
  | "learning-disability"
  | "medical-equipment"
  | "other";

export type RequestState = "requested" | "confirmed" | "contacted" | "completed" | "failed";

export interface AssistanceRequest {
  id: string;
  bookingReference: string;
  sailingId: string;
  needs: NeedKind[];
  ownWords: string;
  companion: boolean;
  mobile?: string;
  createdAt: Date;
  shortNotice: boolean;
  state: RequestState;
  loungeSpaceHeld: boolean;
  personalSafetyBriefing: boolean;
  notes: string[];
}

/** Needs that mean the passenger should embark before vehicles and disembark after them. */
export const EMBARK_FIRST: NeedKind[] = [
  "wheelchair-manual",
  "wheelchair-powered",
  "mobility-scooter",
  "walking-aid",
  "sight-loss",
  "assistance-dog",
];

/** Needs that reserve one of the two chair spaces in the lounge. */
export const NEEDS_LOUNGE_SPACE: NeedKind[] = ["wheelchair-manual", "wheelchair-powered"];

/** Needs that make the ramp incline matter when boarding at a slip. */
export const INCLINE_SENSITIVE: NeedKind[] = ["wheelchair-manual", "wheelchair-powered", "mobility-scooter", "walking-aid"];

/** Needs where announcements must be repeated in person and delays sent by text. */
export const PERSONAL_ANNOUNCEMENTS: NeedKind[] = ["hearing-loss", "sight-loss"];

export interface VesselAccessFacilities {
  vesselId: string;
  loungeChairSpaces: number;
  lift: "lift" | "stair-climber" | "none";
  liftMaxKg: number;
  poweredChairsInLounge: boolean;
  hearingLoop: boolean;
  evacuationChair: boolean;
}

export const FACILITIES: VesselAccessFacilities[] = [
  { vesselId: "sule-lass", loungeChairSpaces: 2, lift: "lift", liftMaxKg: 250, poweredChairsInLounge: true, hearingLoop: true, evacuationChair: true },
  { vesselId: "kittiwake-dawn", loungeChairSpaces: 2, lift: "lift", liftMaxKg: 200, poweredChairsInLounge: true, hearingLoop: true, evacuationChair: true },
  { vesselId: "brannagh", loungeChairSpaces: 2, lift: "stair-climber", liftMaxKg: 150, poweredChairsInLounge: false, hearingLoop: true, evacuationChair: true },
];

export function facilitiesFor(vesselId: string): VesselAccessFacilities | undefined {
  return FACILITIES.find((f) => f.vesselId === vesselId);
}

/** Ramp geometry per slip: how far the ramp hinge sits above datum, and the ramp length. */
export interface SlipRamp {
  berthId: string;
  hingeHeightAboveDatumM: number;
  rampLengthM: number;
}

/** Incline of the ramp as "1 in N": the ramp spans the height between hinge and deck level. */
export function rampInclineAt(tides: TideTable, berth: Berth, ramp: SlipRamp, deckFreeboardM: number, at: Date): number | undefined {
  const height = tides.heightAt(berth.tideStation, at);
  if (height === undefined) return undefined;
  const deckLevel = height + deckFreeboardM;
  const rise = Math.abs(ramp.hingeHeightAboveDatumM - deckLevel);
  if (rise < 0.01) return Infinity;
  return Math.sqrt(Math.max(ramp.rampLengthM ** 2 - rise ** 2, 0)) / rise;
}
