import { test } from "node:test";
import assert from "node:assert/strict";
import { generateTimetable, checkRotations, DEFAULT_GENERATOR_OPTIONS } from "../../src/timetable/timetableGenerator.js";
import { TideTable } from "../../src/timetable/tideTable.js";
import type { Berth, Route, Vessel, VesselId, GeneratedTimetable } from "../../src/timetable/sailingModel.js";

const berths = new Map<string, Berth>([
  ["marrowick", { id: "marrowick", name: "Marrowick", chartedDepthM: 4, minUnderKeelM: 0.5, turnaroundMinutes: 25, tideStation: "orrin-sound", allStatesOfTide: true }],
  ["orrinsay", { id: "orrinsay", name: "Orrinsay slip", chartedDepthM: -0.55, minUnderKeelM: 0.8, turnaroundMinutes: 30, tideStation: "orrin-sound", allStatesOfTide: false }],
]);

const routes = new Map<string, Route>([
  ["mar-orr", { id: "mar-orr", from: "marrowick", to: "orrinsay", summerCrossingMinutes: 40, winterCrossingMinutes: 50 }],
]);

const vessels = new Map<VesselId, Vessel>([
  ["brannagh", { id: "brannagh", name: "Brannagh", loadedDraughtM: 1.6, serviceSpeedKnots: 10, vehicleLanes: 2, passengerCapacity: 120 }],
]);

const tides = new TideTable([
  {
    station: "orrin-sound",
    events: [
      { time: new Date("2025-06-02T02:00Z"), heightM: 0.3, kind: "low" },
      { time: new Date("2025-06-02T08:15Z"), heightM: 4.7, kind: "high" },
      { time: new Date("2025-06-02T14:30Z"), heightM: 0.4, kind: "low" },
      { time: new Date("2025-06-02T20:45Z"), heightM: 4.6, kind: "high" },
      { time: new Date("2025-06-03T03:00Z"), heightM: 0.3, kind: "low" },
    ],
  },
]);

test("departures near high water are kept at their preferred time", () => {
  const result = generateTimetable({
    from: new Date("2025-06-02T00:00Z"), days: 1, routes, berths, vessels, tides,
    pattern: [{ routeId: "mar-orr", vesselId: "brannagh", weekdays: ["Mon"], departures: ["07:30"] }],
  });
  assert.equal(result.sailings.length, 1);
  assert.equal(result.sailings[0].departure.toISOString(), "2025-06-02T07:30:00.000Z");
  assert.equal(result.dropped.length, 0);
});

test("a departure arriving at low water is dropped and reported", () => {
  const result = generateTimetable({
    from: new Date("2025-06-02T00:00Z"), days: 1, routes, berths, vessels, tides,
    pattern: [{ routeId: "mar-orr", vesselId: "brannagh", weekdays: ["Mon"], departures: ["13:50"] }],
  });
  assert.equal(result.sailings.length, 0);
  assert.equal(result.dropped.length, 1);
  assert.match(result.dropped[0].reason, /no tidal window/);
});

test("patterns for other weekdays produce nothing", () => {
  const result = generateTimetable({
    from: new Date("2025-06-02T00:00Z"), days: 1, routes, berths, vessels, tides,
    pattern: [{ routeId: "mar-orr", vesselId: "brannagh", weekdays: ["Sat", "Sun"], departures: ["07:30"] }],
  });
  assert.equal(result.sailings.length, 0);
});

test("overlapping rotations for one vessel are flagged", () => {
  const t: GeneratedTimetable = {
    dropped: [],
    warnings: [],
    sailings: [
      { id: "a", routeId: "mar-orr", vesselId: "brannagh", departure: new Date("2025-06-02T07:00Z"), arrival: new Date("2025-06-02T07:40Z"), status: "scheduled" },
      { id: "b", routeId: "mar-orr", vesselId: "brannagh", departure: new Date("2025-06-02T07:30Z"), arrival: new Date("2025-06-02T08:10Z"), status: "scheduled" },
    ],
  };
  checkRotations(t, DEFAULT_GENERATOR_OPTIONS);
  assert.equal(t.warnings.length, 1);
  assert.match(t.warnings[0], /overlaps/);
});
