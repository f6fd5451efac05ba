import { test } from "node:test";
import assert from "node:assert/strict";
import { validateRest, breaches } from "../../src/crew/restHoursValidator.js";
import type { Duty } from "../../src/crew/rosterModel.js";

function duty(id: string, start: string, end: string): Duty {
  return { id, vesselId: "brannagh", role: "deckhand", start: new Date(start), end: new Date(end), kind: "sailing" };
}

test("a normal eleven-hour day leaves enough rest", () => {
  const v = validateRest([duty("a", "2025-04-07T07:00Z", "2025-04-07T18:00Z")]);
  assert.deepEqual(breaches(v), []);
});

test("two long duties inside 24 hours breach the ten-hour rest minimum", () => {
  const v = validateRest([
    duty("a", "2025-04-07T06:00Z", "2025-04-07T14:00Z"),
    duty("b", "2025-04-07T16:00Z", "2025-04-08T00:30Z"),
  ]);
  assert.ok(breaches(v).some((x) => x.rule === "minRestPer24h"));
});

test("a duty longer than twelve hours is a long-day warning, not a breach", () => {
  const v = validateRest([duty("a", "2025-04-07T06:10Z", "2025-04-07T19:40Z")]);
  assert.equal(breaches(v).length, 0);
  assert.ok(v.some((x) => x.rule === "longDayWarningHours" && x.severity === "warning"));
});

test("a late finish followed by an early start breaches the eleven-hour rule", () => {
  const v = validateRest([
    duty("a", "2025-04-07T13:00Z", "2025-04-07T21:30Z"),
    duty("b", "2025-04-08T06:00Z", "2025-04-08T12:00Z"),
  ]);
  assert.ok(breaches(v).some((x) => x.rule === "minRestAfterLateFinish"));
});

test("a fifth early start in a row is a breach", () => {
  const days = ["07", "08", "09", "10", "11"];
  const v = validateRest(days.map((d) => duty(d, `2025-04-${d}T06:15Z`, `2025-04-${d}T13:00Z`)));
  const early = breaches(v).filter((x) => x.rule === "maxConsecutiveEarlyStarts");
  assert.equal(early.length, 1);
  assert.equal(early[0].at.toISOString().slice(0, 10), "2025-04-11");
});

test("seven long days in a row breach the weekly rest minimum", () => {
  const days = ["07", "08", "09", "10", "11", "12", "13"];
  const v = validateRest(days.map((d) => duty(d, `2025-04-${d}T07:00Z`, `2025-04-${d}T20:30Z`)));
  assert.ok(breaches(v).some((x) => x.rule === "minRestPer7d"));
});
