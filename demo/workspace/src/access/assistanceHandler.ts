// HTTP routes for passenger assistance: create a request from the booking form or the office, the
// day-before review screen, and the muster list for the master.

import type { Router } from "../shared/http.js";
import { ok, badRequest } from "../shared/http.js";
import type { AssistanceRegister, NewRequest } from "./assistanceRequest.js";
import type { NeedKind } from "./accessibilityModel.js";
import type { InclineBand } from "./rampGradient.js";

const KNOWN_NEEDS: NeedKind[] = [
  "wheelchair-manual", "wheelchair-powered", "mobility-scooter", "walking-aid", "sight-loss",
  "hearing-loss", "assistance-dog", "learning-disability", "medical-equipment", "other",
];

const BANDS: InclineBand[] = ["green", "amber", "red"];

export function registerAssistanceRoutes(router: Router, register: AssistanceRegister): void {
  router.add("POST", "/assistance", async (req) => {
    const body = req.body as Partial<NewRequest> & { departure?: string } | undefined;
    if (!body?.bookingReference || !body.sailingId || !body.departure) {
      return badRequest("bookingReference, sailingId and departure are required");
    }
    const needs = (body.needs ?? []).filter((n): n is NeedKind => KNOWN_NEEDS.includes(n as NeedKind));
    const request = register.create({
      bookingReference: body.bookingReference,
      sailingId: body.sailingId,
      departure: new Date(body.departure),
      needs,
      ownWords: body.ownWords ?? "",
      companion: Boolean(body.companion),
      mobile: body.mobile,
    });
    return ok({ id: request.id, shortNotice: request.shortNotice });
  });

  router.add("GET", "/assistance/review/:sailingId", async (req) => {
    const vessel = req.query.get("vessel");
    const band = req.query.get("incline") as InclineBand | null;
    if (!vessel || !band || !BANDS.includes(band)) return badRequest("vessel and incline (green|amber|red) are required");
    const items = register.review(req.params.sailingId, vessel, band);
    return ok(items.map((i) => ({ id: i.request.id, booking: i.request.bookingReference, needs: i.request.needs, actions: i.actions })));
  });

  router.add("GET", "/assistance/muster/:sailingId", async (req) => {
    return ok({ sailing: req.params.sailingId, list: register.musterList(req.params.sailingId) });
  });

  router.add("POST", "/assistance/:id/complete", async (req) => {
    const body = req.body as { ok?: boolean; note?: string } | undefined;
    register.complete(req.params.id, body?.ok !== false, body?.note);
    return ok({ done: true });
  });
}
