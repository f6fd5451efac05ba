// The assistance register: creating requests, the day-before review, and the list sent to the
// master for the muster station. Procedure: notes/accessibility/runbook-handling-assistance-requests.md.

import type { AssistanceRequest, NeedKind } from "./accessibilityModel.js";
import { EMBARK_FIRST, INCLINE_SENSITIVE, NEEDS_LOUNGE_SPACE, PERSONAL_ANNOUNCEMENTS, facilitiesFor } from "./accessibilityModel.js";
import type { InclineBand } from "./rampGradient.js";

export const NOTICE_HOURS = 48;

export interface NewRequest {
  bookingReference: string;
  sailingId: string;
  departure: Date;
  needs: NeedKind[];
  ownWords: string;
  companion: boolean;
  mobile?: string;
}

export interface ReviewItem {
  request: AssistanceRequest;
  actions: string[];
}

export class AssistanceRegister {
  private readonly requests = new Map<string, AssistanceRequest>();
  private sequence = 0;

  constructor(private readonly now: () => Date = () => new Date()) {}

  create(input: NewRequest): AssistanceRequest {
    const created = this.now();
    const request: AssistanceRequest = {
      id: `AR-${++this.sequence}`,
      bookingReference: input.bookingReference,
      sailingId: input.sailingId,
      needs: input.needs.length > 0 ? input.needs : ["other"],
      ownWords: input.ownWords,
      companion: input.companion,
      mobile: input.mobile,
      createdAt: created,
      shortNotice: input.departure.getTime() - created.getTime() < NOTICE_HOURS * 3_600_000,
      state: "requested",
      loungeSpaceHeld: false,
      personalSafetyBriefing: false,
      notes: [],
    };
    this.requests.set(request.id, request);
    return request;
  }

  forSailing(sailingId: string): AssistanceRequest[] {
    return [...this.requests.values()].filter((r) => r.sailingId === sailingId && r.state !== "failed");
  }

  /**
   * Day-before review for one sailing. Works out what the duty officer must do for each request:
   * phone passengers with chairs or scooters when the ramp will be steep, hold lounge spaces, and
   * flag powered chairs on a vessel whose lift cannot take them.
   */
  review(sailingId: string, vesselId: string, incline: InclineBand): ReviewItem[] {
    const facilities = facilitiesFor(vesselId);
    let spacesLeft = facilities?.loungeChairSpaces ?? 0;
    return this.forSailing(sailingId).map((request) => {
      const actions: string[] = [];
      const has = (kinds: NeedKind[]) => request.needs.some((n) => kinds.includes(n));
      if (has(INCLINE_SENSITIVE) && incline === "red") {
        actions.push("phone: ramp steeper than 1 in 8; offer a sailing nearer high water or travel in vehicle");
      } else if (has(INCLINE_SENSITIVE) && incline === "amber") {
        actions.push("crew member to walk alongside on the ramp");
      }
      if (has(NEEDS_LOUNGE_SPACE)) {
        if (request.needs.includes("wheelchair-powered") && facilities && !facilities.poweredChairsInLounge) {
          actions.push("powered chair cannot reach lounge on this vessel: heated vehicle-deck seating");
        } else if (spacesLeft > 0) {
          spacesLeft--;
          request.loungeSpaceHeld = true;
        } else {
          actions.push("no lounge chair space left: tell the master");
        }
      }
      if (has(PERSONAL_ANNOUNCEMENTS)) actions.push("personal safety briefing and announcements in person");
      if (!request.mobile) actions.push("no mobile number: phone via booking contact");
      return { request, actions };
    });
  }

  /** The list printed for the master and the muster station. */
  musterList(sailingId: string): string[] {
    return this.forSailing(sailingId).map((r) => {
      const order = r.needs.some((n) => EMBARK_FIRST.includes(n)) ? "embark first" : "normal";
      return `${r.bookingReference}: ${r.needs.join(", ")}${r.companion ? " + companion" : ""} (${order})`;
    });
  }

  complete(id: string, ok: boolean, note?: string): void {
    const request = this.requests.get(id);
    if (!request) throw new Error(`Unknown assistance request ${id}`);
    request.state = ok ? "completed" : "failed";
    if (note) request.notes.push(note);
  }
}
