// Generates dated sailings from a weekly pattern, placing every call at a tidal berth inside a
// tidal window. See notes/timetables/design-timetable-generator.md for the reasoning.

import type { Berth, GeneratedTimetable, Route, Sailing, Vessel, VesselId } from "./sailingModel.js";
import { crossingMinutes, sailingId } from "./sailingModel.js";
import type { TideTable } from "./tideTable.js";
import { tidalWindows, nextFit, DEFAULT_WINDOW_OPTIONS } from "./tidalWindow.js";
import { addDays, addMinutes, parseClock, startOfDay, weekdayName, overlaps } from "../shared/dates.js";
import type { WeekdayName } from "../shared/dates.js";

export interface PatternEntry {
  routeId: string;
  vesselId: VesselId;
  weekdays: WeekdayName[];
  departures: string[];
}

export interface GeneratorInput {
  from: Date;
  days: number;
  pattern: PatternEntry[];
  routes: Map<string, Route>;
  berths: Map<string, Berth>;
  vessels: Map<VesselId, Vessel>;
  tides: TideTable;
  surgeAllowanceM?: number;
}

export interface GeneratorOptions {
  maxShiftMinutes: number;
  tideCriticalMarginMinutes: number;
  maxVesselDayMinutes: number;
}

export const DEFAULT_GENERATOR_OPTIONS: GeneratorOptions = {
  maxShiftMinutes: 60,
  tideCriticalMarginMinutes: 20,
  maxVesselDayMinutes: 14 * 60,
};

export function generateTimetable(input: GeneratorInput, options = DEFAULT_GENERATOR_OPTIONS): GeneratedTimetable {
  const result: GeneratedTimetable = { sailings: [], dropped: [], warnings: [] };
  for (let d = 0; d < input.days; d++) {
    const day = startOfDay(addDays(input.from, d));
    const weekday = weekdayName(day);
    for (const entry of input.pattern) {
      if (!entry.weekdays.includes(weekday)) continue;
      const route = input.routes.get(entry.routeId);
      const vessel = input.vessels.get(entry.vesselId);
      if (!route || !vessel) {
        result.warnings.push(`Unknown route or vessel in pattern: ${entry.routeId}/${entry.vesselId}`);
        continue;
      }
      const arrivalBerth = input.berths.get(route.to)!;
      const windows = tidalWindows(input.tides, arrivalBerth, vessel, day, addDays(day, 1), {
        ...DEFAULT_WINDOW_OPTIONS,
        surgeAllowanceM: input.surgeAllowanceM ?? 0,
      });
      const crossing = crossingMinutes(route, day);
      for (const clock of entry.departures) {
        const preferred = addMinutes(day, parseClock(clock));
        const arrival = nextFit(
          windows,
          addMinutes(preferred, crossing),
          arrivalBerth.turnaroundMinutes,
          options.maxShiftMinutes,
        );
        if (!arrival) {
          result.dropped.push({
            routeId: route.id,
            preferredDeparture: preferred,
            reason: `no tidal window at ${arrivalBerth.name} for ${vessel.name}`,
          });
          continue;
        }
        const departure = addMinutes(arrival, -crossing);
        const window = windows.find((w) => w.opens <= arrival && arrival <= w.closes);
        const marginMs = window ? window.closes.getTime() - arrival.getTime() : Infinity;
        const critical = marginMs < (arrivalBerth.turnaroundMinutes + options.tideCriticalMarginMinutes) * 60_000;
        const sailing: Sailing = {
          id: sailingId(route.id, departure),
          routeId: route.id,
          vesselId: vessel.id,
          departure,
          arrival,
          status: critical ? "tide-critical" : "scheduled",
          notice: critical ? "Tide permitting" : undefined,
        };
        result.sailings.push(sailing);
      }
    }
  }
  checkRotations(result, options);
  return result;
}

/** Flags vessels booked on two overlapping sailings, or working longer than the day limit. */
export function checkRotations(timetable: GeneratedTimetable, options: GeneratorOptions): void {
  const byVesselDay = new Map<string, Sailing[]>();
  for (const s of timetable.sailings) {
    const key = `${s.vesselId}:${s.departure.toISOString().slice(0, 10)}`;
    const list = byVesselDay.get(key) ?? [];
    list.push(s);
    byVesselDay.set(key, list);
  }
  for (const [key, list] of byVesselDay) {
    list.sort((a, b) => a.departure.getTime() - b.departure.getTime());
    for (let i = 1; i < list.length; i++) {
      if (overlaps(list[i - 1].departure, list[i - 1].arrival, list[i].departure, list[i].arrival)) {
        timetable.warnings.push(`${key}: ${list[i - 1].id} overlaps ${list[i].id}`);
      }
    }
    const span = (list[list.length - 1].arrival.getTime() - list[0].departure.getTime()) / 60_000;
    if (span > options.maxVesselDayMinutes) {
      timetable.warnings.push(`${key}: working day of ${Math.round(span)} minutes exceeds crew limit`);
    }
  }
}
