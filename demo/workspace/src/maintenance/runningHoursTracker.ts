// Running hours per machine, read nightly from the engine monitoring panels. Planned maintenance
// intervals are mostly expressed in running hours (oil change every 500 h, heat exchanger cleaning
// every 1,500 h in summer), so these counters drive the scheduler.

export interface CounterReading {
  equipment: string;
  readAt: Date;
  hours: number;
  source: "panel" | "manual";
}

export class CounterError extends Error {}

export class RunningHoursTracker {
  private readonly readings = new Map<string, CounterReading[]>();

  record(reading: CounterReading): void {
    const list = this.readings.get(reading.equipment) ?? [];
    const last = list[list.length - 1];
    if (last && reading.hours < last.hours) {
      // Counters only go backwards when a panel is replaced or miscalibrated; keep the old value
      // and make someone look at it rather than silently resetting the maintenance plan.
      throw new CounterError(
        `${reading.equipment}: counter went backwards (${last.hours} h -> ${reading.hours} h)`,
      );
    }
    list.push(reading);
    this.readings.set(reading.equipment, list);
  }

  current(equipment: string): number | undefined {
    const list = this.readings.get(equipment);
    return list?.[list.length - 1]?.hours;
  }

  /** Average hours run per day over the last `days` days, used to forecast due dates. */
  dailyRate(equipment: string, now: Date, days = 28): number {
    const list = this.readings.get(equipment) ?? [];
    const since = now.getTime() - days * 86_400_000;
    const window = list.filter((r) => r.readAt.getTime() >= since);
    if (window.length < 2) return 0;
    const first = window[0];
    const last = window[window.length - 1];
    const elapsedDays = (last.readAt.getTime() - first.readAt.getTime()) / 86_400_000;
    return elapsedDays > 0 ? (last.hours - first.hours) / elapsedDays : 0;
  }

  /** Flags a panel whose daily increase is implausible (more than 24 h per day). */
  suspiciousJumps(equipment: string): CounterReading[] {
    const list = this.readings.get(equipment) ?? [];
    const flagged: CounterReading[] = [];
    for (let i = 1; i < list.length; i++) {
      const days = (list[i].readAt.getTime() - list[i - 1].readAt.getTime()) / 86_400_000;
      if (days > 0 && (list[i].hours - list[i - 1].hours) / days > 24) flagged.push(list[i]);
    }
    return flagged;
  }

  /** Compares a manual reading with the panel, e.g. after the Brannagh starboard mismatch. */
  discrepancy(equipment: string, manualHours: number): number | undefined {
    const panel = this.current(equipment);
    return panel === undefined ? undefined : manualHours - panel;
  }
}
