// Tidal windows: periods when a vessel can safely lie alongside a berth. A berth is usable while
//   predicted tide height + charted depth >= vessel draught + minimum under-keel clearance.
// On the ebb the window closes; shallow berths such as Orrinsay slip dry out at low water.

import type { Berth, Vessel } from "../timetable/sailingModel.js";
import type { TideTable } from "../timetable/tideTable.js";
import { addMinutes, MINUTE_MS } from "../shared/dates.js";

export interface TidalWindow {
  berthId: string;
  vesselId: string;
  opens: Date;
  closes: Date;
  /** Smallest clearance under the keel inside the window, in metres. */
  minClearanceM: number;
}

export interface WindowOptions {
  stepMinutes: number;
  /** Extra allowance for negative surge (water below prediction), in metres. */
  surgeAllowanceM: number;
}

export const DEFAULT_WINDOW_OPTIONS: WindowOptions = { stepMinutes: 10, surgeAllowanceM: 0 };

export function clearanceAt(
  tides: TideTable,
  berth: Berth,
  vessel: Vessel,
  at: Date,
  surgeAllowanceM = 0,
): number | undefined {
  const height = tides.heightAt(berth.tideStation, at);
  if (height === undefined) return undefined;
  const waterDepth = height + berth.chartedDepthM - surgeAllowanceM;
  return waterDepth - vessel.loadedDraughtM;
}

export function stepFreeWindows(
  tides: TideTable,
  berth: Berth,
  vessel: Vessel,
  from: Date,
  to: Date,
  options: WindowOptions = DEFAULT_WINDOW_OPTIONS,
): TidalWindow[] {
  if (berth.allStatesOfTide) {
    return [{ berthId: berth.id, vesselId: vessel.id, opens: from, closes: to, minClearanceM: Infinity }];
  }
  const windows: TidalWindow[] = [];
  let current: TidalWindow | undefined;
  for (let t = from; t.getTime() <= to.getTime(); t = addMinutes(t, options.stepMinutes)) {
    const clearance = clearanceAt(tides, berth, vessel, t, options.surgeAllowanceM);
    const usable = clearance !== undefined && clearance >= berth.minUnderKeelM;
    if (usable && clearance !== undefined) {
      if (!current) {
        current = { berthId: berth.id, vesselId: vessel.id, opens: t, closes: t, minClearanceM: clearance };
      }
      current.closes = t;
      current.minClearanceM = Math.min(current.minClearanceM, clearance);
    } else if (current) {
      windows.push(current);
      current = undefined;
    }
  }
  if (current) windows.push(current);
  return windows;
}

export type InclineBand = "green" | "amber" | "red";

/** Green: gentler than 1 in 12. Amber: 1 in 12 to 1 in 8. Red: steeper than 1 in 8. */
export function inclineBand(oneIn: number): InclineBand {
  if (oneIn >= 12) return "green";
  if (oneIn >= 8) return "amber";
  return "red";
}

/** Can a vessel arrive at `arrival`, turn around and leave before the window closes? */
export function fitsWindow(windows: TidalWindow[], arrival: Date, turnaroundMinutes: number): boolean {
  const leave = arrival.getTime() + turnaroundMinutes * MINUTE_MS;
  return windows.some((w) => w.opens.getTime() <= arrival.getTime() && leave <= w.closes.getTime());
}

/** The earliest arrival at or after `wanted` that fits, or undefined within the search limit. */
export function nextFit(
  windows: TidalWindow[],
  wanted: Date,
  turnaroundMinutes: number,
  maxShiftMinutes: number,
  stepMinutes = 10,
): Date | undefined {
  for (let shift = 0; shift <= maxShiftMinutes; shift += stepMinutes) {
    const later = addMinutes(wanted, shift);
    if (fitsWindow(windows, later, turnaroundMinutes)) return later;
    const earlier = addMinutes(wanted, -shift);
    if (shift > 0 && fitsWindow(windows, earlier, turnaroundMinutes)) return earlier;
  }
  return undefined;
}
