import { test } from "node:test";
import assert from "node:assert/strict";
import { forecastDue, dueWorkOrders, tightenInterval, type PlannedTask } from "../../src/maintenance/maintenanceScheduler.js";
import { RunningHoursTracker } from "../../src/maintenance/runningHoursTracker.js";

const now = new Date("2025-04-01T00:00Z");

function trackerWithRate(equipment: string, startHours: number, perDay: number): RunningHoursTracker {
  const t = new RunningHoursTracker();
  for (let d = 28; d >= 0; d--) {
    t.record({
      equipment,
      readAt: new Date(now.getTime() - d * 86_400_000),
      hours: startHours + (28 - d) * perDay,
      source: "panel",
    });
  }
  return t;
}

const oilChange: PlannedTask = {
  code: "ME-OIL",
  title: "Main engine oil and filter change",
  vesselId: "brannagh",
  equipment: "brannagh/port-main",
  intervalHours: 500,
  intervalDays: 182,
  lastDoneAt: new Date("2025-03-01T00:00Z"),
  lastDoneHours: 10_000,
  needsLayup: false,
};

test("an hours interval is forecast from the recent daily running rate", () => {
  const hours = trackerWithRate("brannagh/port-main", 10_000, 10);
  const f = forecastDue(oilChange, hours, now);
  assert.equal(f.dueBy, "hours");
  assert.equal(f.hoursRemaining, 500 - 280);
  const days = (f.dueAt.getTime() - now.getTime()) / 86_400_000;
  assert.ok(Math.abs(days - 22) < 0.01);
});

test("a calendar interval wins when the vessel is laid up", () => {
  const hours = trackerWithRate("brannagh/port-main", 10_000, 0);
  const f = forecastDue(oilChange, hours, now);
  assert.equal(f.dueBy, "days");
});

test("work orders are raised only inside the lead time and not twice", () => {
  const hours = trackerWithRate("brannagh/port-main", 10_000, 20);
  const orders = dueWorkOrders([oilChange], hours, now, [], { leadDays: 14, rateWindowDays: 28 });
  assert.equal(orders.length, 1);
  assert.equal(orders[0].taskCode, "ME-OIL");
  const again = dueWorkOrders([oilChange], hours, now, orders, { leadDays: 14, rateWindowDays: 28 });
  assert.equal(again.length, 0);
});

test("layup tasks carry a note for the planning desk", () => {
  const hours = trackerWithRate("brannagh/thruster", 3_000, 2);
  const overhaul = { ...oilChange, code: "BT-OH", equipment: "brannagh/thruster", intervalHours: undefined, intervalDays: 30, needsLayup: true };
  const [order] = dueWorkOrders([overhaul], hours, now, []);
  assert.match(order.notes[0], /out of service/);
});

test("tightening an interval scales both hours and days", () => {
  const tighter = tightenInterval({ ...oilChange, intervalHours: 2_000, intervalDays: 365 }, 0.75);
  assert.equal(tighter.intervalHours, 1_500);
  assert.equal(tighter.intervalDays, 274);
});
