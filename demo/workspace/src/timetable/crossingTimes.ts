// Crossing-time statistics from the voyage log. The planning desk uses these to decide whether the
// published crossing minutes are realistic (see the winter rotation notes on the Vellick route).

export interface VoyageLogEntry {
  routeId: string;
  scheduledDeparture: Date;
  actualDeparture: Date;
  actualArrival: Date;
  swellM?: number;
}

export interface CrossingStats {
  routeId: string;
  count: number;
  meanMinutes: number;
  p90Minutes: number;
  punctuality: number;
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1));
  return sorted[rank];
}

/** Punctual = departed no more than `graceMinutes` after schedule. */
export function crossingStats(
  entries: VoyageLogEntry[],
  graceMinutes = 5,
): CrossingStats[] {
  const byRoute = new Map<string, VoyageLogEntry[]>();
  for (const e of entries) {
    const list = byRoute.get(e.routeId) ?? [];
    list.push(e);
    byRoute.set(e.routeId, list);
  }
  const stats: CrossingStats[] = [];
  for (const [routeId, list] of byRoute) {
    const durations = list
      .map((e) => (e.actualArrival.getTime() - e.actualDeparture.getTime()) / 60_000)
      .sort((a, b) => a - b);
    const onTime = list.filter(
      (e) => e.actualDeparture.getTime() - e.scheduledDeparture.getTime() <= graceMinutes * 60_000,
    ).length;
    const mean = durations.reduce((sum, d) => sum + d, 0) / durations.length;
    stats.push({
      routeId,
      count: list.length,
      meanMinutes: Math.round(mean * 10) / 10,
      p90Minutes: percentile(durations, 0.9),
      punctuality: onTime / list.length,
    });
  }
  return stats.sort((a, b) => a.routeId.localeCompare(b.routeId));
}

/** Suggests a planned crossing time: the 85th percentile rounded up to five minutes. */
export function suggestedCrossingMinutes(entries: VoyageLogEntry[], routeId: string): number | undefined {
  const durations = entries
    .filter((e) => e.routeId === routeId)
    .map((e) => (e.actualArrival.getTime() - e.actualDeparture.getTime()) / 60_000)
    .sort((a, b) => a - b);
  if (durations.length < 20) return undefined;
  return Math.ceil(percentile(durations, 0.85) / 5) * 5;
}

/** Mean crossing time split by swell band, to show how much the beam sea costs us. */
export function minutesBySwell(entries: VoyageLogEntry[], routeId: string): Record<string, number> {
  const bands: Record<string, number[]> = { calm: [], moderate: [], rough: [] };
  for (const e of entries) {
    if (e.routeId !== routeId || e.swellM === undefined) continue;
    const band = e.swellM < 1 ? "calm" : e.swellM < 2 ? "moderate" : "rough";
    bands[band].push((e.actualArrival.getTime() - e.actualDeparture.getTime()) / 60_000);
  }
  const out: Record<string, number> = {};
  for (const [band, values] of Object.entries(bands)) {
    if (values.length > 0) out[band] = values.reduce((a, b) => a + b, 0) / values.length;
  }
  return out;
}
