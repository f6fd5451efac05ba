// Client for the marine forecast feed. Returns hourly wind, gusts, wave height and visibility for our
// sea area, plus any active gale or storm warnings. Falls back to the last good forecast when the feed
// is unreachable, and says so, so the go/no-go screen can show it is stale.

import type { Logger } from "../shared/logger.js";

export interface HourlyForecast {
  at: Date;
  meanWindKnots: number;
  gustKnots: number;
  windFromDegrees: number;
  significantWaveM: number;
  visibilityNm: number;
}

export type WarningLevel = "none" | "strong-wind" | "gale" | "severe-gale" | "storm";

export interface AreaWarning {
  level: WarningLevel;
  issuedAt: Date;
  validFrom: Date;
  validTo: Date;
  text: string;
}

export interface SailingForecast {
  sailingId: string;
  routeId: string;
  departure: Date;
  arrival: Date;
  hours: HourlyForecast[];
  warnings: AreaWarning[];
  stale: boolean;
}

interface RawFeed {
  issued: string;
  hourly: Array<{ t: string; wind: number; gust: number; dir: number; hs: number; vis: number }>;
  warnings: Array<{ level: WarningLevel; issued: string; from: string; to: string; text: string }>;
}

export class ForecastClient {
  private lastGood?: RawFeed;

  constructor(
    private readonly baseUrl: string,
    private readonly log: Logger,
    private readonly fetchImpl: typeof fetch = fetch,
  ) {}

  async fetchFeed(): Promise<{ feed: RawFeed; stale: boolean }> {
    try {
      const response = await this.fetchImpl(`${this.baseUrl}/area/orrin-sound/hourly`, {
        signal: AbortSignal.timeout(8_000),
      });
      if (!response.ok) throw new Error(`forecast feed returned ${response.status}`);
      this.lastGood = (await response.json()) as RawFeed;
      return { feed: this.lastGood, stale: false };
    } catch (err) {
      if (!this.lastGood) throw err;
      this.log.warn("forecast feed unreachable, using last good forecast", { error: (err as Error).message });
      return { feed: this.lastGood, stale: true };
    }
  }

  /** Forecast hours covering a sailing's departure to arrival, plus warnings valid in that period. */
  async forSailing(sailingId: string, departure?: Date, arrival?: Date, routeId = ""): Promise<SailingForecast> {
    const { feed, stale } = await this.fetchFeed();
    const from = departure ?? new Date();
    const to = arrival ?? new Date(from.getTime() + 3_600_000);
    const hours = feed.hourly
      .map((h) => ({
        at: new Date(h.t),
        meanWindKnots: h.wind,
        gustKnots: h.gust,
        windFromDegrees: h.dir,
        significantWaveM: h.hs,
        visibilityNm: h.vis,
      }))
      .filter((h) => h.at.getTime() >= from.getTime() - 3_600_000 && h.at.getTime() <= to.getTime());
    const warnings = feed.warnings
      .map((w) => ({ level: w.level, issuedAt: new Date(w.issued), validFrom: new Date(w.from), validTo: new Date(w.to), text: w.text }))
      .filter((w) => w.validFrom <= to && from <= w.validTo);
    return { sailingId, routeId, departure: from, arrival: to, hours, warnings, stale };
  }
}

export function worstWarning(warnings: AreaWarning[]): WarningLevel {
  const order: WarningLevel[] = ["none", "strong-wind", "gale", "severe-gale", "storm"];
  return warnings.reduce<WarningLevel>(
    (worst, w) => (order.indexOf(w.level) > order.indexOf(worst) ? w.level : worst),
    "none",
  );
}
