// Entry point: wires the stores, services and handlers together and starts listening.

import { Router, serve } from "./shared/http.js";
import { createLogger, stdoutSink } from "./shared/logger.js";
import { registerTimetableRoutes } from "./timetable/timetableHandler.js";
import { registerTicketRoutes } from "./ticketing/ticketHandler.js";
import { registerAssistanceRoutes } from "./access/assistanceHandler.js";
import { TideTable } from "./timetable/tideTable.js";
import { RefundService, InMemoryRefundStore } from "./ticketing/refundService.js";
import { InMemoryBookingStore } from "./ticketing/bookingModel.js";
import { AssistanceRegister } from "./access/assistanceRequest.js";
import { ForecastClient } from "./weather/forecastClient.js";
import { decideSailing } from "./weather/sailingDecision.js";
import { readFileSync } from "node:fs";

const log = createLogger(stdoutSink, (process.env.LOG_LEVEL as "info") ?? "info", { service: "orrin-ferries" });

const tides = TideTable.fromJson(JSON.parse(readFileSync("config/tide-stations.json", "utf8")));
const bookings = new InMemoryBookingStore();
const refunds = new RefundService(bookings, new InMemoryRefundStore(), log.child({ area: "refunds" }));
const assistance = new AssistanceRegister();
const forecasts = new ForecastClient(process.env.FORECAST_URL ?? "http://localhost:8089", log);

const router = new Router();
registerTimetableRoutes(router, tides);
registerTicketRoutes(router, bookings, refunds);
registerAssistanceRoutes(router, assistance);

router.add("GET", "/sailings/:id/decision", async (req) => {
  const forecast = await forecasts.forSailing(req.params.id);
  const decision = decideSailing(forecast);
  if (decision.outcome === "cancel") {
    const count = await refunds.refundAllForSailing(req.params.id, "weather");
    log.warn("sailing called off", { sailingId: req.params.id, refundsQueued: count });
  }
  return { status: 200, body: decision };
});

const port = Number(process.env.PORT ?? 8080);
serve(router, port);
log.info("listening", { port });
