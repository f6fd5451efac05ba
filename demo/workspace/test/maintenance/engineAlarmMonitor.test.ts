import { test } from "node:test";
import assert from "node:assert/strict";
import { EngineAlarmMonitor, type EngineSample } from "../../src/maintenance/engineAlarmMonitor.js";
import { DefectRegister } from "../../src/maintenance/defectService.js";

const t0 = new Date("2025-08-14T14:00Z");

function sample(minutes: number, coolantTempC: number, extra: Partial<EngineSample> = {}): EngineSample {
  return {
    vesselId: "brannagh",
    engine: "port",
    at: new Date(t0.getTime() + minutes * 60_000),
    coolantTempC,
    oilPressureBar: 4.1,
    seaWaterPressureBar: 1.4,
    loadPercent: 85,
    ...extra,
  };
}

test("a normal running temperature raises nothing", () => {
  const monitor = new EngineAlarmMonitor(new DefectRegister(() => t0));
  assert.deepEqual(monitor.ingest(sample(0, 78)), []);
});

test("coolant above the pre-alarm level reports the engine running hot and files a defect", () => {
  const defects = new DefectRegister(() => t0);
  const monitor = new EngineAlarmMonitor(defects);
  const alarms = monitor.ingest(sample(0, 90));
  assert.equal(alarms[0].kind, "running-hot");
  assert.equal(defects.open("brannagh").length, 1);
});

test("overheating above the alarm level asks for reduced load", () => {
  const monitor = new EngineAlarmMonitor(new DefectRegister(() => t0));
  const [alarm] = monitor.ingest(sample(0, 96));
  assert.equal(alarm.kind, "overheating");
  assert.match(alarm.message, /reduce load/);
});

test("a fast rise at steady load is caught before any fixed threshold", () => {
  const monitor = new EngineAlarmMonitor(new DefectRegister(() => t0));
  monitor.ingest(sample(0, 76));
  monitor.ingest(sample(5, 79));
  const alarms = monitor.ingest(sample(10, 83, { seaWaterPressureBar: 0.5 }));
  const rise = alarms.find((a) => a.kind === "rapid-rise");
  assert.ok(rise);
  assert.match(rise.message, /strainer and impeller/);
});

test("a rise that follows a load increase is not treated as a fault", () => {
  const monitor = new EngineAlarmMonitor(new DefectRegister(() => t0));
  monitor.ingest(sample(0, 72, { loadPercent: 40 }));
  const alarms = monitor.ingest(sample(10, 80, { loadPercent: 90 }));
  assert.equal(alarms.length, 0);
});

test("low oil pressure under load is a safety defect", () => {
  const defects = new DefectRegister(() => t0);
  const monitor = new EngineAlarmMonitor(defects);
  monitor.ingest(sample(0, 80, { oilPressureBar: 1.2 }));
  assert.equal(defects.open()[0].affectsSafety, true);
});
