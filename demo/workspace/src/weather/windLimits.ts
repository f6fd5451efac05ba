// Weather limits per route and per berth, from notes/safety/weather-limits-policy.md and
// config/weather-thresholds.yaml. Above a limit a sailing is normally cancelled; the master decides.

export interface RouteLimits {
  routeId: string;
  meanWindKnots: number;
  gustKnots: number;
  significantWaveM: number;
  /** Restricted visibility (fog, mist, heavy rain) below this stops a departure. */
  minVisibilityNm: number;
}

export interface BerthWindLimit {
  berthId: string;
  /** Wind directions (degrees from) that blow onto or across the berth. */
  fromDegrees: [number, number];
  maxMeanKnots: number;
}

export const ROUTE_LIMITS: RouteLimits[] = [
  { routeId: "mar-vel", meanWindKnots: 35, gustKnots: 45, significantWaveM: 2.5, minVisibilityNm: 0.5 },
  { routeId: "mar-orr", meanWindKnots: 30, gustKnots: 40, significantWaveM: 2.0, minVisibilityNm: 0.5 },
  { routeId: "orr-tar", meanWindKnots: 28, gustKnots: 38, significantWaveM: 1.8, minVisibilityNm: 0.5 },
];

export const BERTH_LIMITS: BerthWindLimit[] = [
  { berthId: "orrinsay", fromDegrees: [20, 70], maxMeanKnots: 25 },
  { berthId: "vellick", fromDegrees: [200, 250], maxMeanKnots: 30 },
  { berthId: "tarnay", fromDegrees: [90, 160], maxMeanKnots: 24 },
];

export function limitsFor(routeId: string): RouteLimits {
  const limits = ROUTE_LIMITS.find((l) => l.routeId === routeId);
  if (!limits) throw new Error(`No weather limits configured for route ${routeId}`);
  return limits;
}

/** True when a wind direction (degrees from) lies in a sector, handling sectors across north. */
export function inSector(degrees: number, [from, to]: [number, number]): boolean {
  const d = ((degrees % 360) + 360) % 360;
  return from <= to ? d >= from && d <= to : d >= from || d <= to;
}

export interface LimitCheck {
  exceeded: string[];
  /** Ratio of the worst reading to its limit; above 0.85 counts as "at risk". */
  worstRatio: number;
}

export function checkRouteLimits(
  limits: RouteLimits,
  reading: { meanWindKnots: number; gustKnots: number; significantWaveM: number; visibilityNm: number },
): LimitCheck {
  const ratios: Array<[string, number]> = [
    ["mean wind", reading.meanWindKnots / limits.meanWindKnots],
    ["gusts", reading.gustKnots / limits.gustKnots],
    ["wave height", reading.significantWaveM / limits.significantWaveM],
    ["visibility", limits.minVisibilityNm / Math.max(reading.visibilityNm, 0.01)],
  ];
  return {
    exceeded: ratios.filter(([, r]) => r > 1).map(([name]) => name),
    worstRatio: Math.max(...ratios.map(([, r]) => r)),
  };
}

export function checkBerthWind(berthId: string, meanWindKnots: number, fromDegrees: number): boolean {
  const limit = BERTH_LIMITS.find((b) => b.berthId === berthId);
  if (!limit) return true;
  return !(inSector(fromDegrees, limit.fromDegrees) && meanWindKnots > limit.maxMeanKnots);
}
