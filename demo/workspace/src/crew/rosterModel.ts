// Crew, duties and rosters. A duty is one continuous period of work on one vessel; a roster maps
// duties to crew members over a four-week period.

export type Role = "master" | "mate" | "engineer" | "deckhand" | "catering";

export type CertificateKind =
  | "coc-master"
  | "coc-watch"
  | "coc-engineer"
  | "medical"
  | "basic-safety"
  | "fire-advanced"
  | "crowd-management"
  | "radio"
  | "familiarisation";

export interface Certificate {
  kind: CertificateKind;
  vesselId?: string;
  expires: Date;
}

export interface CrewMember {
  id: string;
  name: string;
  role: Role;
  homeIsland?: "orrinsay" | "vellick" | "tarnay";
  certificates: Certificate[];
  contractedHoursPerWeek: number;
  reliefPool: boolean;
  leave: Array<{ from: Date; to: Date }>;
}

export interface Duty {
  id: string;
  vesselId: string;
  role: Role;
  start: Date;
  end: Date;
  kind: "sailing" | "standby" | "training" | "medical";
}

export interface Assignment {
  dutyId: string;
  crewId: string;
}

export interface Roster {
  periodStart: Date;
  periodEnd: Date;
  duties: Duty[];
  assignments: Assignment[];
}

export const REQUIRED_CERTIFICATES: Record<Role, CertificateKind[]> = {
  master: ["coc-master", "medical", "radio", "fire-advanced", "crowd-management", "familiarisation"],
  mate: ["coc-watch", "medical", "radio", "fire-advanced", "crowd-management", "familiarisation"],
  engineer: ["coc-engineer", "medical", "fire-advanced", "familiarisation"],
  deckhand: ["basic-safety", "medical", "crowd-management", "familiarisation"],
  catering: ["basic-safety", "medical", "crowd-management", "familiarisation"],
};

/** Which roles may cover a duty: a mate may cover a deckhand, a master may cover a mate. */
export const CAN_COVER: Record<Role, Role[]> = {
  master: ["master", "mate", "deckhand"],
  mate: ["mate", "deckhand"],
  engineer: ["engineer"],
  deckhand: ["deckhand"],
  catering: ["catering"],
};

export function dutyHours(duty: Duty): number {
  return (duty.end.getTime() - duty.start.getTime()) / 3_600_000;
}

export function dutiesFor(roster: Roster, crewId: string): Duty[] {
  const ids = new Set(roster.assignments.filter((a) => a.crewId === crewId).map((a) => a.dutyId));
  return roster.duties.filter((d) => ids.has(d.id)).sort((a, b) => a.start.getTime() - b.start.getTime());
}

export function onLeave(member: CrewMember, duty: Duty): boolean {
  return member.leave.some((l) => l.from < duty.end && duty.start < l.to);
}
