// Incident log: weather suspensions, near misses, injuries, equipment failures affecting safety.
// The safety committee reviews it each season; counts per category feed the winter report.

export type IncidentKind =
  | "weather-suspension"
  | "near-miss"
  | "injury"
  | "man-overboard"
  | "equipment-failure"
  | "passenger-assistance";

export interface Incident {
  id: string;
  kind: IncidentKind;
  vesselId?: string;
  occurredAt: Date;
  reportedBy: string;
  summary: string;
  sailingsCancelled: string[];
  reportableToFlagState: boolean;
  closedAt?: Date;
}

const PREFIX: Record<IncidentKind, string> = {
  "weather-suspension": "WX",
  "near-miss": "NM",
  injury: "INJ",
  "man-overboard": "MOB",
  "equipment-failure": "EQ",
  "passenger-assistance": "PA",
};

export class IncidentLog {
  private readonly incidents: Incident[] = [];
  private readonly counters = new Map<string, number>();

  record(input: Omit<Incident, "id" | "reportableToFlagState"> & { reportableToFlagState?: boolean }): Incident {
    const year = input.occurredAt.getUTCFullYear();
    const key = `${PREFIX[input.kind]}-${year}`;
    const n = (this.counters.get(key) ?? 0) + 1;
    this.counters.set(key, n);
    const incident: Incident = {
      ...input,
      id: `${key}-${String(n).padStart(2, "0")}`,
      // Man overboard and injuries needing hospital treatment are always reportable.
      reportableToFlagState: input.reportableToFlagState ?? (input.kind === "man-overboard" || input.kind === "injury"),
    };
    this.incidents.push(incident);
    return incident;
  }

  /** Records a weather suspension with the sailings that were called off. */
  recordSuspension(vesselId: string, from: Date, reason: string, cancelled: string[], by: string): Incident {
    return this.record({
      kind: "weather-suspension",
      vesselId,
      occurredAt: from,
      reportedBy: by,
      summary: reason,
      sailingsCancelled: cancelled,
    });
  }

  between(from: Date, to: Date): Incident[] {
    return this.incidents.filter((i) => i.occurredAt >= from && i.occurredAt < to);
  }

  /** Season summary for the safety committee: counts by kind and total sailings cancelled. */
  seasonSummary(from: Date, to: Date): { byKind: Record<string, number>; sailingsCancelled: number } {
    const byKind: Record<string, number> = {};
    let sailingsCancelled = 0;
    for (const incident of this.between(from, to)) {
      byKind[incident.kind] = (byKind[incident.kind] ?? 0) + 1;
      sailingsCancelled += incident.sailingsCancelled.length;
    }
    return { byKind, sailingsCancelled };
  }

  open(): Incident[] {
    return this.incidents.filter((i) => !i.closedAt);
  }
}
