// Shift swaps between crew members. A swap is accepted only if both resulting duty lists pass the
// hours of rest rules and the taker holds the certificates for the role. See shift-swap-faq.md.

import type { CrewMember, Duty, Roster } from "./rosterModel.js";
import { CAN_COVER, dutiesFor } from "./rosterModel.js";
import { breaches, validateRest, DEFAULT_REST_RULES, type RestViolation } from "./restHoursValidator.js";
import { missingCertificates } from "./certificateTracker.js";

export interface SwapRequest {
  offeredDutyId: string;
  fromCrewId: string;
  toCrewId: string;
  /** Optional duty given back in return; undefined for a give-away. */
  returnedDutyId?: string;
  requestedAt: Date;
}

export type SwapOutcome =
  | { accepted: true; roster: Roster }
  | { accepted: false; reason: string; violations?: RestViolation[] };

export const SWAP_CUTOFF_HOURS = 12;

export function evaluateSwap(roster: Roster, crew: Map<string, CrewMember>, request: SwapRequest): SwapOutcome {
  const offered = roster.duties.find((d) => d.id === request.offeredDutyId);
  const taker = crew.get(request.toCrewId);
  const giver = crew.get(request.fromCrewId);
  if (!offered || !taker || !giver) return { accepted: false, reason: "unknown duty or crew member" };

  const returned = request.returnedDutyId ? roster.duties.find((d) => d.id === request.returnedDutyId) : undefined;
  const earliest = returned && returned.start < offered.start ? returned.start : offered.start;
  if (earliest.getTime() - request.requestedAt.getTime() < SWAP_CUTOFF_HOURS * 3_600_000) {
    return { accepted: false, reason: `swaps close ${SWAP_CUTOFF_HOURS} h before the duty; ask the roster office` };
  }

  const problems = [
    ...roleProblems(taker, offered),
    ...(returned ? roleProblems(giver, returned) : []),
  ];
  if (problems.length > 0) return { accepted: false, reason: problems.join("; ") };

  const swapped: Roster = {
    ...roster,
    assignments: roster.assignments.map((a) => {
      if (a.dutyId === offered.id) return { ...a, crewId: taker.id };
      if (returned && a.dutyId === returned.id) return { ...a, crewId: giver.id };
      return a;
    }),
  };

  const violations = [
    ...breaches(validateRest(dutiesFor(swapped, taker.id), DEFAULT_REST_RULES)),
    ...breaches(validateRest(dutiesFor(swapped, giver.id), DEFAULT_REST_RULES)),
  ];
  if (violations.length > 0) {
    return { accepted: false, reason: `swap breaks hours of rest: ${violations[0].detail}`, violations };
  }
  return { accepted: true, roster: swapped };
}

function roleProblems(member: CrewMember, duty: Duty): string[] {
  if (!CAN_COVER[member.role].includes(duty.role)) {
    return [`${member.name} (${member.role}) cannot cover a ${duty.role} duty`];
  }
  const missing = missingCertificates(member, duty.role, duty.vesselId, duty.end);
  return missing.length > 0 ? [`${member.name} lacks ${missing.join(", ")} on that date`] : [];
}
