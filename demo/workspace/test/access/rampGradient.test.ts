import { test } from "node:test";
import assert from "node:assert/strict";
import { inclineBand, stepFreeWindows } from "../../src/access/rampGradient.js";
import { rampInclineAt, type SlipRamp } from "../../src/access/accessibilityModel.js";
import { TideTable } from "../../src/timetable/tideTable.js";
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

const brannagh: Vessel = { id: "brannagh", name: "Brannagh", loadedDraughtM: 1.6, serviceSpeedKnots: 10, vehicleLanes: 2, passengerCapacity: 120 };

const ramp: SlipRamp = { berthId: "orrinsay", hingeHeightAboveDatumM: 5.2, rampLengthM: 9 };

const tides = new TideTable([
  {
    station: "orrin-sound",
    events: [
      { time: new Date("2025-04-14T03:00Z"), heightM: 0.4, kind: "low" },
      { time: new Date("2025-04-14T09:15Z"), heightM: 4.6, kind: "high" },
      { time: new Date("2025-04-14T15:30Z"), heightM: 0.5, kind: "low" },
    ],
  },
]);

test("the ramp is gentle near high water", () => {
  const oneIn = rampInclineAt(tides, orrinsay, ramp, 0.9, new Date("2025-04-14T09:15Z"));
  assert.ok(oneIn !== undefined && oneIn >= 12, `expected green, got 1 in ${oneIn}`);
  assert.equal(inclineBand(oneIn!), "green");
});

test("the ramp is steep on the ebb, some hours after high water", () => {
  const oneIn = rampInclineAt(tides, orrinsay, ramp, 0.9, new Date("2025-04-14T12:40Z"));
  assert.ok(oneIn !== undefined);
  assert.equal(inclineBand(oneIn!), "red");
});

test("bands follow the published thresholds", () => {
  assert.equal(inclineBand(15), "green");
  assert.equal(inclineBand(12), "green");
  assert.equal(inclineBand(10), "amber");
  assert.equal(inclineBand(7), "red");
});

test("outside the prediction range the incline is unknown", () => {
  assert.equal(rampInclineAt(tides, orrinsay, ramp, 0.9, new Date("2025-04-15T12:00Z")), undefined);
});

test("step-free windows are the same windows the timetable uses", () => {
  const windows = stepFreeWindows(tides, orrinsay, brannagh, new Date("2025-04-14T03:00Z"), new Date("2025-04-14T15:30Z"));
  assert.equal(windows.length, 1);
});
