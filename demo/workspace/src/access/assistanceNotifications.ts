// Messages for passengers on the assistance list. Passengers with hearing loss get a text for every
// delay over 15 minutes (agreed at the accessibility forum, March 2025); everyone on the list gets a
// phone contact the day before when the ramp incline for their sailing is red.

import type { AssistanceRequest } from "./accessibilityModel.js";
import { INCLINE_SENSITIVE, PERSONAL_ANNOUNCEMENTS } from "./accessibilityModel.js";
import type { InclineBand } from "./rampGradient.js";

export interface OutgoingMessage {
  to: string;
  channel: "sms" | "phone-task";
  text: string;
  requestId: string;
}

export const DELAY_TEXT_THRESHOLD_MINUTES = 15;

export function delayMessages(requests: AssistanceRequest[], delayMinutes: number, newDeparture: string): OutgoingMessage[] {
  if (delayMinutes <= DELAY_TEXT_THRESHOLD_MINUTES) return [];
  return requests
    .filter((r) => r.mobile && r.needs.some((n) => PERSONAL_ANNOUNCEMENTS.includes(n)))
    .map((r) => ({
      to: r.mobile!,
      channel: "sms" as const,
      requestId: r.id,
      text: `Your sailing is delayed by about ${delayMinutes} minutes. New departure ${newDeparture}. A crew member will find you at the help point.`,
    }));
}

export function inclinePhoneTasks(requests: AssistanceRequest[], band: InclineBand): OutgoingMessage[] {
  if (band !== "red") return [];
  return requests
    .filter((r) => r.needs.some((n) => INCLINE_SENSITIVE.includes(n)))
    .map((r) => ({
      to: r.mobile ?? `booking:${r.bookingReference}`,
      channel: "phone-task" as const,
      requestId: r.id,
      text:
        "Ramp will be steeper than 1 in 8 at arrival. Offer a sailing nearer high water (free change) " +
        "or travelling in the vehicle. Record the passenger's choice on the request.",
    }));
}

/** Cancellation texts go to everyone; for passengers on the list we add who to phone for help rebooking. */
export function cancellationMessage(request: AssistanceRequest, sailingLabel: string): OutgoingMessage | undefined {
  if (!request.mobile) return undefined;
  return {
    to: request.mobile,
    channel: "sms",
    requestId: request.id,
    text:
      `${sailingLabel} has been called off. Your assistance booking moves with you to any sailing you ` +
      "choose. Phone the ticket office and we will rebook you and your help together, or arrange a refund; " +
      "fares for a sailing that is called off are always reimbursed in full.",
  };
}

export function summarise(messages: OutgoingMessage[]): { sms: number; phoneTasks: number } {
  let sms = 0;
  let phoneTasks = 0;
  for (const m of messages) {
    if (m.channel === "sms") sms++;
    else phoneTasks++;
  }
  return { sms, phoneTasks };
}
