import { test } from "node:test";
import assert from "node:assert/strict";
import { checkRouteLimits, checkBerthWind, inSector, limitsFor } from "../../src/weather/windLimits.js";
import { routeWaveHeight, beamSeaRisk, trend } from "../../src/weather/swellModel.js";

test("readings below every limit exceed nothing", () => {
  const check = checkRouteLimits(limitsFor("mar-vel"), { meanWindKnots: 20, gustKnots: 30, significantWaveM: 1.2, visibilityNm: 4 });
  assert.deepEqual(check.exceeded, []);
  assert.ok(check.worstRatio < 1);
});

test("poor visibility counts as exceeding the limit", () => {
  const check = checkRouteLimits(limitsFor("mar-vel"), { meanWindKnots: 5, gustKnots: 8, significantWaveM: 0.3, visibilityNm: 0.3 });
  assert.deepEqual(check.exceeded, ["visibility"]);
});

test("wind sectors that cross north are handled", () => {
  assert.equal(inSector(350, [330, 30]), true);
  assert.equal(inSector(10, [330, 30]), true);
  assert.equal(inSector(90, [330, 30]), false);
});

test("a strong south-westerly across Vellick pier fails the berth check", () => {
  assert.equal(checkBerthWind("vellick", 32, 225), false);
  assert.equal(checkBerthWind("vellick", 32, 45), true);
});

test("an unknown route has no limits rather than permissive defaults", () => {
  assert.throws(() => limitsFor("mar-nowhere"));
});

test("sheltered routes see lower waves than the offshore buoy", () => {
  const reading = { at: new Date(), significantWaveM: 3.0, peakPeriodS: 8, fromDegrees: 220 };
  assert.equal(routeWaveHeight("orr-tar", reading), 1.2);
  assert.equal(routeWaveHeight("mar-vel", reading), 2.7);
});

test("long-period swell reduces the shelter", () => {
  const short = routeWaveHeight("mar-orr", { at: new Date(), significantWaveM: 2, peakPeriodS: 8, fromDegrees: 220 });
  const long = routeWaveHeight("mar-orr", { at: new Date(), significantWaveM: 2, peakPeriodS: 14, fromDegrees: 220 });
  assert.ok(long > short);
});

test("sea direction relative to heading", () => {
  assert.equal(beamSeaRisk(0, 0), "head");
  assert.equal(beamSeaRisk(0, 90), "beam");
  assert.equal(beamSeaRisk(0, 180), "following");
});

test("a rising buoy is reported as building", () => {
  const t = (h: number, hs: number) => ({ at: new Date(2025, 0, 1, h), significantWaveM: hs, peakPeriodS: 9, fromDegrees: 240 });
  assert.equal(trend([t(0, 1.2), t(1, 1.4), t(2, 1.8)]), "building");
  assert.equal(trend([t(0, 2.2), t(1, 2.0), t(2, 1.6)]), "easing");
});
