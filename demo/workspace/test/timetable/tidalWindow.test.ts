import { test } from "node:test";
import assert from "node:assert/strict";
import { TideTable } from "../../src/timetable/tideTable.js";
import { tidalWindows, fitsWindow, nextFit } from "../../src/timetable/tidalWindow.js";
import type { Berth, Vessel } from "../../src/timetable/sailingModel.js";

const orrinsay: Berth = {
  id: "orrinsay",
  name: "Orrinsay slip",
  chartedDepthM: -0.55,
  minUnderKeelM: 0.8,
  turnaroundMinutes: 30,
  tideStation: "orrin-sound",
  allStatesOfTide: false,
};

const brannagh: Vessel = {
  id: "brannagh",
  name: "Brannagh",
  loadedDraughtM: 1.6,
  serviceSpeedKnots: 10,
  vehicleLanes: 2,
  passengerCapacity: 120,
};

// A simple semi-diurnal day: low 0.4 m at 03:00, high 4.6 m at 09:15, low 0.5 m at 15:30.
const tides = new TideTable([
  {
    station: "orrin-sound",
    events: [
      { time: new Date("2025-03-10T03:00Z"), heightM: 0.4, kind: "low" },
      { time: new Date("2025-03-10T09:15Z"), heightM: 4.6, kind: "high" },
      { time: new Date("2025-03-10T15:30Z"), heightM: 0.5, kind: "low" },
      { time: new Date("2025-03-10T21:45Z"), heightM: 4.5, kind: "high" },
    ],
  },
]);

test("the slip is unusable around low water and usable around high water", () => {
  const windows = tidalWindows(tides, orrinsay, brannagh, new Date("2025-03-10T03:00Z"), new Date("2025-03-10T15:30Z"));
  assert.equal(windows.length, 1);
  const [w] = windows;
  assert.ok(w.opens > new Date("2025-03-10T04:00Z"), "window opens after the flood has made");
  assert.ok(w.closes < new Date("2025-03-10T14:30Z"), "window closes well before low water on the ebb");
  assert.ok(w.minClearanceM >= orrinsay.minUnderKeelM);
});

test("a deep-water berth is one window covering the whole range", () => {
  const deep = { ...orrinsay, id: "vellick" as const, allStatesOfTide: true };
  const windows = tidalWindows(tides, deep, brannagh, new Date("2025-03-10T00:00Z"), new Date("2025-03-11T00:00Z"));
  assert.equal(windows.length, 1);
});

test("a call must finish its turnaround before the window closes", () => {
  const windows = tidalWindows(tides, orrinsay, brannagh, new Date("2025-03-10T03:00Z"), new Date("2025-03-10T15:30Z"));
  const lastMinute = new Date(windows[0].closes.getTime() - 10 * 60_000);
  assert.equal(fitsWindow(windows, lastMinute, 30), false);
  assert.equal(fitsWindow(windows, new Date("2025-03-10T09:00Z"), 30), true);
});

test("nextFit shifts a call that arrives too early on the flood", () => {
  const windows = tidalWindows(tides, orrinsay, brannagh, new Date("2025-03-10T03:00Z"), new Date("2025-03-10T15:30Z"));
  const early = new Date(windows[0].opens.getTime() - 30 * 60_000);
  const moved = nextFit(windows, early, 30, 60);
  assert.ok(moved);
  assert.ok(moved.getTime() >= windows[0].opens.getTime());
});

test("a deeper-draught vessel gets a shorter window at the same berth", () => {
  const suleLass = { ...brannagh, id: "sule-lass" as const, loadedDraughtM: 2.1 };
  const from = new Date("2025-03-10T03:00Z");
  const to = new Date("2025-03-10T15:30Z");
  const small = tidalWindows(tides, orrinsay, brannagh, from, to)[0];
  const big = tidalWindows(tides, orrinsay, suleLass, from, to)[0];
  assert.ok(big.closes.getTime() - big.opens.getTime() < small.closes.getTime() - small.opens.getTime());
});
