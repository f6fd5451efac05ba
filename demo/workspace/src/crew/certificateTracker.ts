// Certificate and medical expiry tracking for crew. The roster builder asks whether a crew member
// can legally fill a role on a date; the nightly job sends expiry reminders at 90, 60 and 30 days.

import type { Certificate, CertificateKind, CrewMember, Role } from "./rosterModel.js";
import { REQUIRED_CERTIFICATES } from "./rosterModel.js";

export const REMINDER_DAYS = [90, 60, 30] as const;

function validOn(cert: Certificate, date: Date): boolean {
  return cert.expires.getTime() >= date.getTime();
}

function findCertificate(member: CrewMember, kind: CertificateKind, vesselId?: string): Certificate | undefined {
  return member.certificates.find(
    (c) => c.kind === kind && (kind !== "familiarisation" || c.vesselId === vesselId),
  );
}

/** Missing or expired certificates for a role on a vessel at a date. Empty means fit to work. */
export function missingCertificates(member: CrewMember, role: Role, vesselId: string, date: Date): CertificateKind[] {
  const missing: CertificateKind[] = [];
  for (const kind of REQUIRED_CERTIFICATES[role]) {
    const cert = findCertificate(member, kind, vesselId);
    if (!cert || !validOn(cert, date)) missing.push(kind);
  }
  return missing;
}

export function hasValidCertificates(member: CrewMember, role: Role, vesselId: string, date: Date): boolean {
  return missingCertificates(member, role, vesselId, date).length === 0;
}

export interface ExpiryReminder {
  crewId: string;
  name: string;
  kind: CertificateKind;
  expires: Date;
  daysLeft: number;
}

/** Reminders due today: exactly 90, 60 or 30 days before expiry, plus anything already expired. */
export function remindersDue(crew: CrewMember[], today: Date): ExpiryReminder[] {
  const reminders: ExpiryReminder[] = [];
  for (const member of crew) {
    for (const cert of member.certificates) {
      const daysLeft = Math.floor((cert.expires.getTime() - today.getTime()) / 86_400_000);
      if ((REMINDER_DAYS as readonly number[]).includes(daysLeft) || daysLeft < 0) {
        reminders.push({ crewId: member.id, name: member.name, kind: cert.kind, expires: cert.expires, daysLeft });
      }
    }
  }
  return reminders.sort((a, b) => a.daysLeft - b.daysLeft);
}

/** Crew who would drop below minimum manning for a role if their certificates lapse this month. */
export function atRiskThisMonth(crew: CrewMember[], role: Role, today: Date): CrewMember[] {
  const monthEnd = new Date(Date.UTC(today.getUTCFullYear(), today.getUTCMonth() + 1, 1));
  return crew.filter((m) =>
    m.role === role &&
    m.certificates.some((c) => c.expires >= today && c.expires < monthEnd),
  );
}
