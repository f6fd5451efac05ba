// Hours of rest validation. Implements the limits in notes/crew/rest-hours-policy.md: the national
// seafarer rules (10 h rest in any 24 h, 77 h in any 7 days, at most two rest periods in 24 h with
// one of at least 6 h, at most 14 h between rest periods) plus the cooperative's own fatigue rules.
// Rest is everything that is not a duty. Long duties leave watchkeepers tired and drowsy, so they
// are flagged as a warning even when legal.

import type { Duty } from "./rosterModel.js";

export interface RestRules {
  minRestPer24h: number;
  minRestPer7d: number;
  maxRestPeriodsPer24h: number;
  minLongestRestPeriod: number;
  maxGapBetweenRests: number;
  maxConsecutiveEarlyStarts: number;
  earlyStartHour: number;
  lateFinishHour: number;
  minRestAfterLateFinish: number;
  longDayWarningHours: number;
}

export const DEFAULT_REST_RULES: RestRules = {
  minRestPer24h: 10,
  minRestPer7d: 77,
  maxRestPeriodsPer24h: 2,
  minLongestRestPeriod: 6,
  maxGapBetweenRests: 14,
  maxConsecutiveEarlyStarts: 4,
  earlyStartHour: 7,
  lateFinishHour: 21,
  minRestAfterLateFinish: 11,
  longDayWarningHours: 12,
};

export interface RestViolation {
  rule: keyof RestRules;
  at: Date;
  detail: string;
  severity: "breach" | "warning";
}

const HOUR = 3_600_000;

function workedHoursIn(duties: Duty[], from: number, to: number): number {
  let total = 0;
  for (const d of duties) {
    const start = Math.max(from, d.start.getTime());
    const end = Math.min(to, d.end.getTime());
    if (end > start) total += (end - start) / HOUR;
  }
  return total;
}

/** Checks one crew member's duties (sorted by start). Windows are anchored at each duty start. */
export function validateRest(duties: Duty[], rules: RestRules = DEFAULT_REST_RULES): RestViolation[] {
  const sorted = [...duties].sort((a, b) => a.start.getTime() - b.start.getTime());
  const violations: RestViolation[] = [];

  for (const duty of sorted) {
    const t = duty.start.getTime();
    const rest24 = 24 - workedHoursIn(sorted, t, t + 24 * HOUR);
    if (rest24 < rules.minRestPer24h) {
      violations.push({ rule: "minRestPer24h", at: duty.start, severity: "breach", detail: `only ${rest24.toFixed(1)} h rest in the 24 h from this duty` });
    }
    const rest7d = 168 - workedHoursIn(sorted, t, t + 168 * HOUR);
    if (rest7d < rules.minRestPer7d) {
      violations.push({ rule: "minRestPer7d", at: duty.start, severity: "breach", detail: `only ${rest7d.toFixed(1)} h rest in 7 days` });
    }
    const dayLength = (duty.end.getTime() - t) / HOUR;
    if (dayLength > rules.longDayWarningHours) {
      violations.push({ rule: "longDayWarningHours", at: duty.start, severity: "warning", detail: `${dayLength.toFixed(1)} h duty: fatigue risk` });
    }
  }

  for (let i = 1; i < sorted.length; i++) {
    const prev = sorted[i - 1];
    const next = sorted[i];
    const gap = (next.start.getTime() - prev.end.getTime()) / HOUR;
    const workSpan = (next.end.getTime() - prev.start.getTime()) / HOUR;
    if (gap < rules.minLongestRestPeriod && workSpan - gap > rules.maxGapBetweenRests) {
      violations.push({ rule: "maxGapBetweenRests", at: next.start, severity: "breach", detail: `${workSpan.toFixed(1)} h without a proper rest period` });
    }
    if (prev.end.getUTCHours() >= rules.lateFinishHour && gap < rules.minRestAfterLateFinish) {
      violations.push({ rule: "minRestAfterLateFinish", at: next.start, severity: "breach", detail: `only ${gap.toFixed(1)} h off after a late finish` });
    }
  }

  let earlyRun = 0;
  let lastDay = "";
  for (const duty of sorted) {
    const day = duty.start.toISOString().slice(0, 10);
    if (day === lastDay) continue;
    lastDay = day;
    earlyRun = duty.start.getUTCHours() < rules.earlyStartHour ? earlyRun + 1 : 0;
    if (earlyRun > rules.maxConsecutiveEarlyStarts) {
      violations.push({ rule: "maxConsecutiveEarlyStarts", at: duty.start, severity: "breach", detail: `${earlyRun} early starts in a row` });
    }
  }
  return violations;
}

export function breaches(violations: RestViolation[]): RestViolation[] {
  return violations.filter((v) => v.severity === "breach");
}
