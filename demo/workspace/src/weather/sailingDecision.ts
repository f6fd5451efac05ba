// The daily go/no-go check. For each sailing it compares the forecast with the route and berth limits
// and any area warning, and proposes GO, AT RISK or CANCEL. It advises; the master decides. When a
// sailing is called off, the caller sets its status to cancelled, which queues refunds.

import type { SailingForecast } from "./forecastClient.js";
import { worstWarning } from "./forecastClient.js";
import { checkBerthWind, checkRouteLimits, limitsFor } from "./windLimits.js";

export type Outcome = "go" | "at-risk" | "cancel";

export interface SailingDecision {
  sailingId: string;
  outcome: Outcome;
  reasons: string[];
  /** Forecast data was stale: show it on the screen and decide with extra care. */
  staleForecast: boolean;
  reviewAt?: Date;
}

export interface DecisionOptions {
  atRiskRatio: number;
  reviewEveryHours: number;
  arrivalBerth?: string;
}

export const DEFAULT_DECISION_OPTIONS: DecisionOptions = { atRiskRatio: 0.85, reviewEveryHours: 2 };

export function decideSailing(forecast: SailingForecast, options: DecisionOptions = DEFAULT_DECISION_OPTIONS): SailingDecision {
  const reasons: string[] = [];
  let outcome: Outcome = "go";

  const warning = worstWarning(forecast.warnings);
  if (warning === "storm") {
    // Storm warning for the sea area: all sailings suspended by default (safety committee, Jan 2025).
    outcome = "cancel";
    reasons.push("storm warning in force for the sea area");
  } else if (warning === "gale" || warning === "severe-gale") {
    reasons.push(`${warning} warning: sail only if local readings stay below limits`);
    outcome = "at-risk";
  }

  if (forecast.routeId) {
    const limits = limitsFor(forecast.routeId);
    for (const hour of forecast.hours) {
      const check = checkRouteLimits(limits, hour);
      if (check.exceeded.length > 0) {
        outcome = "cancel";
        reasons.push(`${hour.at.toISOString().slice(11, 16)}: ${check.exceeded.join(", ")} above limit`);
      } else if (check.worstRatio > options.atRiskRatio && outcome === "go") {
        outcome = "at-risk";
        reasons.push(`${hour.at.toISOString().slice(11, 16)}: close to limits`);
      }
      if (options.arrivalBerth && !checkBerthWind(options.arrivalBerth, hour.meanWindKnots, hour.windFromDegrees)) {
        outcome = "cancel";
        reasons.push(`wind onto ${options.arrivalBerth} berth too strong for coming alongside`);
      }
    }
  }

  if (forecast.hours.length === 0) {
    outcome = outcome === "cancel" ? "cancel" : "at-risk";
    reasons.push("no forecast hours cover this sailing");
  }

  const reviewAt =
    outcome === "go" ? undefined : new Date(forecast.departure.getTime() - options.reviewEveryHours * 3_600_000);

  return { sailingId: forecast.sailingId, outcome, reasons, staleForecast: forecast.stale, reviewAt };
}

/** Service can restart when every reading in the last hour was below limits and the next hours are too. */
export function canResume(recent: SailingForecast, upcoming: SailingForecast): boolean {
  if (worstWarning(upcoming.warnings) === "storm") return false;
  const limits = limitsFor(upcoming.routeId);
  const allBelow = (f: SailingForecast) => f.hours.every((h) => checkRouteLimits(limits, h).exceeded.length === 0);
  return recent.hours.length > 0 && allBelow(recent) && allBelow(upcoming);
}

/** Message text for passengers, in plain words. */
export function passengerNotice(decision: SailingDecision): string {
  switch (decision.outcome) {
    case "go":
      return "Sailing as planned.";
    case "at-risk":
      return decision.reviewAt
        ? `Under review at ${decision.reviewAt.toISOString().slice(11, 16)} due to the weather.`
        : "Under review due to the weather.";
    case "cancel":
      return "This sailing is cancelled due to the weather. You can move to another sailing free of charge or get a full refund.";
  }
}
