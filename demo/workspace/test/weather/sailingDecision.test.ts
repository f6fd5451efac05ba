import { test } from "node:test";
import assert from "node:assert/strict";
import { decideSailing, canResume, passengerNotice } from "../../src/weather/sailingDecision.js";
import type { SailingForecast, HourlyForecast, AreaWarning } from "../../src/weather/forecastClient.js";

const departure = new Date("2025-01-20T09:00Z");

function hour(h: number, wind: number, gust: number, wave = 1.0, dir = 240, vis = 5): HourlyForecast {
  return { at: new Date(departure.getTime() + h * 3_600_000), meanWindKnots: wind, gustKnots: gust, windFromDegrees: dir, significantWaveM: wave, visibilityNm: vis };
}

function forecast(hours: HourlyForecast[], warnings: AreaWarning[] = [], routeId = "mar-vel"): SailingForecast {
  return { sailingId: `${routeId}@x`, routeId, departure, arrival: new Date(departure.getTime() + 3_600_000), hours, warnings, stale: false };
}

const storm: AreaWarning = { level: "storm", issuedAt: departure, validFrom: departure, validTo: new Date(departure.getTime() + 12 * 3_600_000), text: "Storm 10 expected" };
const gale: AreaWarning = { ...storm, level: "gale", text: "Gale 8 expected later" };

test("light winds give a plain go", () => {
  const d = decideSailing(forecast([hour(0, 12, 18), hour(1, 14, 20)]));
  assert.equal(d.outcome, "go");
  assert.equal(d.reasons.length, 0);
});

test("a storm warning cancels even when local readings are calm", () => {
  const d = decideSailing(forecast([hour(0, 12, 18)], [storm]));
  assert.equal(d.outcome, "cancel");
  assert.match(d.reasons[0], /storm warning/);
});

test("a gale warning with readings below limits leaves the sailing at risk", () => {
  const d = decideSailing(forecast([hour(0, 20, 28)], [gale]));
  assert.equal(d.outcome, "at-risk");
});

test("gusts above the route limit cancel the sailing", () => {
  const d = decideSailing(forecast([hour(0, 30, 47)]));
  assert.equal(d.outcome, "cancel");
  assert.match(d.reasons.join(" "), /gusts/);
});

test("the Orrinsay route has lower limits than Vellick for the same wind", () => {
  const hours = [hour(0, 32, 39)];
  assert.equal(decideSailing(forecast(hours)).outcome, "at-risk");
  assert.equal(decideSailing(forecast(hours, [], "mar-orr")).outcome, "cancel");
});

test("a north-easterly onto Orrinsay slip cancels for the berth even below route limits", () => {
  const d = decideSailing(forecast([hour(0, 27, 33, 1.0, 45)], [], "mar-orr"), { atRiskRatio: 0.85, reviewEveryHours: 2, arrivalBerth: "orrinsay" });
  assert.equal(d.outcome, "cancel");
});

test("service resumes only after an hour below limits with no storm ahead", () => {
  assert.equal(canResume(forecast([hour(-1, 25, 33)]), forecast([hour(0, 24, 32)])), true);
  assert.equal(canResume(forecast([hour(-1, 38, 50)]), forecast([hour(0, 24, 32)])), false);
  assert.equal(canResume(forecast([hour(-1, 25, 33)]), forecast([hour(0, 24, 32)], [storm])), false);
});

test("passengers are told about refunds when a sailing is cancelled", () => {
  const d = decideSailing(forecast([hour(0, 40, 55)]));
  assert.match(passengerNotice(d), /refund/);
});
