// Watches engine monitoring data for overheating (high coolant temperature) and low oil pressure. The panels on board already
// sound their own alarms; this monitor adds the trend checks the panels lack (a coolant temperature
// rising fast at steady load means a cooling fault long before the high-temperature alarm) and
// files a defect so the event is never lost. Thresholds match the coolant guidance note.

import type { DefectRegister, Defect } from "./defectService.js";
import type { VesselId } from "./workOrder.js";

export interface EngineSample {
  vesselId: VesselId;
  engine: "port" | "starboard" | "thruster";
  at: Date;
  coolantTempC: number;
  oilPressureBar: number;
  seaWaterPressureBar: number;
  loadPercent: number;
}

export interface AlarmThresholds {
  coolantPreAlarmC: number;
  coolantAlarmC: number;
  coolantShutdownC: number;
  riseCPerTenMinutes: number;
  minOilPressureBar: number;
  minSeaWaterPressureBar: number;
}

export const DEFAULT_THRESHOLDS: AlarmThresholds = {
  coolantPreAlarmC: 88,
  coolantAlarmC: 95,
  coolantShutdownC: 99,
  riseCPerTenMinutes: 5,
  minOilPressureBar: 2.0,
  minSeaWaterPressureBar: 0.8,
};

export type AlarmKind = "running-hot" | "overheating" | "shutdown-imminent" | "rapid-rise" | "low-oil-pressure";

export interface EngineAlarm {
  kind: AlarmKind;
  sample: EngineSample;
  message: string;
}

export class EngineAlarmMonitor {
  private readonly history = new Map<string, EngineSample[]>();

  constructor(
    private readonly defects: DefectRegister,
    private readonly thresholds: AlarmThresholds = DEFAULT_THRESHOLDS,
  ) {}

  ingest(sample: EngineSample): EngineAlarm[] {
    const key = `${sample.vesselId}:${sample.engine}`;
    const list = this.history.get(key) ?? [];
    list.push(sample);
    // Keep thirty minutes of samples; enough for the trend check.
    const cutoff = sample.at.getTime() - 30 * 60_000;
    this.history.set(key, list.filter((s) => s.at.getTime() >= cutoff));

    const alarms: EngineAlarm[] = [];
    const t = this.thresholds;
    if (sample.coolantTempC >= t.coolantShutdownC) {
      alarms.push({ kind: "shutdown-imminent", sample, message: `Coolant ${sample.coolantTempC} °C: engine at shutdown limit` });
    } else if (sample.coolantTempC >= t.coolantAlarmC) {
      alarms.push({ kind: "overheating", sample, message: `Engine overheating: coolant ${sample.coolantTempC} °C, reduce load` });
    } else if (sample.coolantTempC >= t.coolantPreAlarmC) {
      alarms.push({ kind: "running-hot", sample, message: `Engine running hot: coolant ${sample.coolantTempC} °C, above the pre-alarm level` });
    }

    const tenMinutesAgo = this.history.get(key)!.find((s) => sample.at.getTime() - s.at.getTime() >= 10 * 60_000 - 30_000);
    if (tenMinutesAgo && Math.abs(sample.loadPercent - tenMinutesAgo.loadPercent) < 10) {
      const rise = sample.coolantTempC - tenMinutesAgo.coolantTempC;
      if (rise > t.riseCPerTenMinutes) {
        const hint = sample.seaWaterPressureBar < t.minSeaWaterPressureBar ? " (low sea-water pressure: check strainer and impeller)" : "";
        alarms.push({ kind: "rapid-rise", sample, message: `Coolant up ${rise.toFixed(1)} °C in ten minutes at steady load${hint}` });
      }
    }

    if (sample.oilPressureBar < t.minOilPressureBar && sample.loadPercent > 20) {
      alarms.push({ kind: "low-oil-pressure", sample, message: `Oil pressure ${sample.oilPressureBar} bar under load` });
    }

    for (const alarm of alarms) this.fileDefect(alarm);
    return alarms;
  }

  private fileDefect(alarm: EngineAlarm): Defect {
    return this.defects.report({
      vesselId: alarm.sample.vesselId,
      location: `${alarm.sample.engine} engine`,
      description: alarm.message,
      reportedBy: "engine-alarm-monitor",
      affectsSafety: alarm.kind === "shutdown-imminent" || alarm.kind === "low-oil-pressure",
    });
  }
}
