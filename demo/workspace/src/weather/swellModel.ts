// Rough estimate of the sea state on each route from the offshore wave buoy. Our routes are partly
// sheltered by the islands, so the offshore significant wave height overstates what a vessel meets on
// the Orrinsay and Tarnay crossings for most directions. Factors were fitted by the masters from two
// winters of bridge log estimates against the buoy; treat them as rough.

export interface BuoyReading {
  at: Date;
  significantWaveM: number;
  peakPeriodS: number;
  fromDegrees: number;
}

interface ShelterSector {
  fromDegrees: [number, number];
  factor: number;
}

const SHELTER: Record<string, ShelterSector[]> = {
  "mar-vel": [
    { fromDegrees: [180, 270], factor: 0.9 },
    { fromDegrees: [270, 360], factor: 0.6 },
  ],
  "mar-orr": [
    { fromDegrees: [180, 270], factor: 0.5 },
    { fromDegrees: [0, 90], factor: 0.8 },
  ],
  "orr-tar": [
    { fromDegrees: [180, 270], factor: 0.4 },
    { fromDegrees: [90, 180], factor: 0.7 },
  ],
};

const DEFAULT_FACTOR = 0.7;

export function shelterFactor(routeId: string, fromDegrees: number): number {
  const sectors = SHELTER[routeId] ?? [];
  const d = ((fromDegrees % 360) + 360) % 360;
  const match = sectors.find((s) => d >= s.fromDegrees[0] && d < s.fromDegrees[1]);
  return match ? match.factor : DEFAULT_FACTOR;
}

/** Estimated wave height on the route. Long-period swell wraps round headlands, so shelter is less. */
export function routeWaveHeight(routeId: string, reading: BuoyReading): number {
  const base = shelterFactor(routeId, reading.fromDegrees);
  const swellBoost = reading.peakPeriodS > 10 ? Math.min(0.2, (reading.peakPeriodS - 10) * 0.05) : 0;
  const factor = Math.min(1, base + swellBoost);
  return Math.round(reading.significantWaveM * factor * 100) / 100;
}

/** Beam seas make loading at the stern ramp and the crossing itself harder than head seas. */
export function beamSeaRisk(routeHeadingDegrees: number, fromDegrees: number): "head" | "beam" | "following" {
  const relative = Math.abs((((fromDegrees - routeHeadingDegrees) % 360) + 540) % 360 - 180);
  // relative is 0 when the sea comes from dead ahead.
  if (relative < 45) return "head";
  if (relative > 135) return "following";
  return "beam";
}

/** Trend over the last readings, used to say "easing" or "building" on the go/no-go screen. */
export function trend(readings: BuoyReading[]): "easing" | "steady" | "building" {
  if (readings.length < 3) return "steady";
  const sorted = [...readings].sort((a, b) => a.at.getTime() - b.at.getTime());
  const first = sorted[0].significantWaveM;
  const last = sorted[sorted.length - 1].significantWaveM;
  if (last - first > 0.3) return "building";
  if (first - last > 0.3) return "easing";
  return "steady";
}
