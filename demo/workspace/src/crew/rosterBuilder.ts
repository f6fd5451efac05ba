// Greedy roster builder. Duties are filled in time order; for each duty we pick the eligible crew
// member with the fewest hours so far who would not breach the hours of rest rules. Unfilled
// duties are returned for the relief pool. See notes/crew/design-roster-builder.md.

import type { Assignment, CrewMember, Duty, Roster } from "./rosterModel.js";
import { CAN_COVER, dutyHours, onLeave } from "./rosterModel.js";
import { breaches, validateRest, DEFAULT_REST_RULES, type RestRules } from "./restHoursValidator.js";
import { hasValidCertificates } from "./certificateTracker.js";

export interface BuildResult {
  roster: Roster;
  unfilled: Duty[];
  hoursByCrew: Map<string, number>;
}

export interface BuildOptions {
  rules: RestRules;
  preferReliefLast: boolean;
}

export const DEFAULT_BUILD_OPTIONS: BuildOptions = { rules: DEFAULT_REST_RULES, preferReliefLast: true };

export function buildRoster(
  duties: Duty[],
  crew: CrewMember[],
  periodStart: Date,
  periodEnd: Date,
  options: BuildOptions = DEFAULT_BUILD_OPTIONS,
): BuildResult {
  const ordered = [...duties].sort((a, b) => a.start.getTime() - b.start.getTime());
  const assignments: Assignment[] = [];
  const dutiesByCrew = new Map<string, Duty[]>(crew.map((c) => [c.id, []]));
  const hoursByCrew = new Map<string, number>(crew.map((c) => [c.id, 0]));
  const unfilled: Duty[] = [];

  for (const duty of ordered) {
    const candidates = crew
      .filter((c) => CAN_COVER[c.role].includes(duty.role))
      .filter((c) => !onLeave(c, duty))
      .filter((c) => hasValidCertificates(c, duty.role, duty.vesselId, duty.end))
      .filter((c) => !clashes(dutiesByCrew.get(c.id)!, duty))
      .filter((c) => breaches(validateRest([...dutiesByCrew.get(c.id)!, duty], options.rules)).length === 0)
      .sort((a, b) => {
        if (options.preferReliefLast && a.reliefPool !== b.reliefPool) return a.reliefPool ? 1 : -1;
        if (a.role === duty.role && b.role !== duty.role) return -1;
        if (b.role === duty.role && a.role !== duty.role) return 1;
        return hoursByCrew.get(a.id)! - hoursByCrew.get(b.id)!;
      });
    const chosen = candidates[0];
    if (!chosen) {
      unfilled.push(duty);
      continue;
    }
    assignments.push({ dutyId: duty.id, crewId: chosen.id });
    dutiesByCrew.get(chosen.id)!.push(duty);
    hoursByCrew.set(chosen.id, hoursByCrew.get(chosen.id)! + dutyHours(duty));
  }

  return { roster: { periodStart, periodEnd, duties: ordered, assignments }, unfilled, hoursByCrew };
}

function clashes(existing: Duty[], duty: Duty): boolean {
  return existing.some((d) => d.start < duty.end && duty.start < d.end);
}

/** Turns a vessel's working day into duties for each role in its manning scale. */
export function dutiesForVesselDay(
  vesselId: string,
  firstDeparture: Date,
  lastArrival: Date,
  manning: Partial<Record<Duty["role"], number>>,
  prepMinutes = 45,
  securingMinutes = 30,
): Duty[] {
  const start = new Date(firstDeparture.getTime() - prepMinutes * 60_000);
  const end = new Date(lastArrival.getTime() + securingMinutes * 60_000);
  const duties: Duty[] = [];
  for (const [role, count] of Object.entries(manning) as Array<[Duty["role"], number]>) {
    for (let i = 0; i < count; i++) {
      duties.push({
        id: `${vesselId}:${start.toISOString().slice(0, 10)}:${role}:${i + 1}`,
        vesselId,
        role,
        start,
        end,
        kind: "sailing",
      });
    }
  }
  return duties;
}

/** Fairness report: weekend duties per crew member, for the roster office to balance by hand. */
export function weekendDuties(result: BuildResult): Map<string, number> {
  const counts = new Map<string, number>();
  const byId = new Map(result.roster.duties.map((d) => [d.id, d]));
  for (const a of result.roster.assignments) {
    const day = byId.get(a.dutyId)!.start.getUTCDay();
    if (day === 0 || day === 6) counts.set(a.crewId, (counts.get(a.crewId) ?? 0) + 1);
  }
  return counts;
}
