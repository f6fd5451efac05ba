// HTTP routes for the timetable: the public departures list, the tidal window report used by the
// planning desk, and publishing.

import type { Router } from "../shared/http.js";
import { ok, badRequest } from "../shared/http.js";
import type { TideTable } from "./tideTable.js";
import type { Berth, Sailing, Vessel } from "./sailingModel.js";
import { tidalWindows } from "./tidalWindow.js";
import { addDays, formatClock, startOfDay } from "../shared/dates.js";

export interface TimetableStore {
  sailingsOn(date: Date): Promise<Sailing[]>;
  publish(sailings: Sailing[]): Promise<{ moved: number; removed: number }>;
  berth(id: string): Berth | undefined;
  vessel(id: string): Vessel | undefined;
}

let store: TimetableStore | undefined;

export function useTimetableStore(s: TimetableStore): void {
  store = s;
}

export function registerTimetableRoutes(router: Router, tides: TideTable): void {
  router.add("GET", "/timetable/:date", async (req) => {
    if (!store) return { status: 503, body: { error: "timetable store not ready" } };
    const date = new Date(req.params.date);
    if (Number.isNaN(date.getTime())) return badRequest("date must be YYYY-MM-DD");
    const sailings = await store.sailingsOn(date);
    return ok(
      sailings.map((s) => ({
        id: s.id,
        route: s.routeId,
        departs: formatClock(s.departure.getUTCHours() * 60 + s.departure.getUTCMinutes()),
        status: s.status,
        notice: s.notice ?? null,
      })),
    );
  });

  router.add("GET", "/timetable/windows", async (req) => {
    if (!store) return { status: 503, body: { error: "timetable store not ready" } };
    const berth = store.berth(req.query.get("berth") ?? "");
    const vessel = store.vessel(req.query.get("vessel") ?? "brannagh");
    const dateText = req.query.get("date");
    if (!berth || !vessel || !dateText) return badRequest("berth, vessel and date are required");
    const day = startOfDay(new Date(dateText));
    const windows = tidalWindows(tides, berth, vessel, day, addDays(day, 1));
    return ok({
      berth: berth.name,
      vessel: vessel.name,
      windows: windows.map((w) => ({
        opens: w.opens.toISOString(),
        closes: w.closes.toISOString(),
        minClearanceM: Number.isFinite(w.minClearanceM) ? Number(w.minClearanceM.toFixed(2)) : null,
      })),
    });
  });

  router.add("POST", "/timetable/publish", async (req) => {
    if (!store) return { status: 503, body: { error: "timetable store not ready" } };
    const body = req.body as { sailings?: Sailing[] } | undefined;
    if (!body?.sailings?.length) return badRequest("nothing to publish");
    const summary = await store.publish(body.sailings);
    return ok(summary);
  });
}
