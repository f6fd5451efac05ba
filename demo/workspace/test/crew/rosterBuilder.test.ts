import { test } from "node:test";
import assert from "node:assert/strict";
import { buildRoster, dutiesForVesselDay } from "../../src/crew/rosterBuilder.js";
import type { CrewMember, Certificate } from "../../src/crew/rosterModel.js";

const farFuture = new Date("2030-01-01T00:00Z");

function certs(kinds: Certificate["kind"][], vesselId = "brannagh"): Certificate[] {
  return kinds.map((kind) => ({ kind, expires: farFuture, vesselId: kind === "familiarisation" ? vesselId : undefined }));
}

function deckhand(id: string, extra: Partial<CrewMember> = {}): CrewMember {
  return {
    id,
    name: id,
    role: "deckhand",
    certificates: certs(["basic-safety", "medical", "crowd-management", "familiarisation"]),
    contractedHoursPerWeek: 40,
    reliefPool: false,
    leave: [],
    ...extra,
  };
}

const day1 = dutiesForVesselDay("brannagh", new Date("2025-04-07T07:00Z"), new Date("2025-04-07T17:00Z"), { deckhand: 2 });
const day2 = dutiesForVesselDay("brannagh", new Date("2025-04-08T07:00Z"), new Date("2025-04-08T17:00Z"), { deckhand: 2 });

test("every duty is filled when enough qualified crew are available", () => {
  const result = buildRoster([...day1, ...day2], [deckhand("a"), deckhand("b"), deckhand("c")], new Date("2025-04-07"), new Date("2025-04-09"));
  assert.equal(result.unfilled.length, 0);
  assert.equal(result.roster.assignments.length, 4);
});

test("work is spread to the crew member with the fewest hours", () => {
  const result = buildRoster([...day1, ...day2], [deckhand("a"), deckhand("b"), deckhand("c")], new Date("2025-04-07"), new Date("2025-04-09"));
  const hours = [...result.hoursByCrew.values()].sort();
  assert.ok(Math.max(...hours) - Math.min(...hours) <= 11.25);
});

test("relief pool members are used only when regular crew cannot cover", () => {
  const result = buildRoster(day1, [deckhand("a"), deckhand("b"), deckhand("r", { reliefPool: true })], new Date("2025-04-07"), new Date("2025-04-08"));
  assert.ok(!result.roster.assignments.some((a) => a.crewId === "r"));
});

test("crew on leave or with an expired medical are not rostered", () => {
  const expired = deckhand("x", {
    certificates: [
      ...certs(["basic-safety", "crowd-management", "familiarisation"]),
      { kind: "medical", expires: new Date("2025-03-31T00:00Z") },
    ],
  });
  const away = deckhand("y", { leave: [{ from: new Date("2025-04-06"), to: new Date("2025-04-10") }] });
  const result = buildRoster(day1, [expired, away, deckhand("z")], new Date("2025-04-07"), new Date("2025-04-08"));
  assert.equal(result.unfilled.length, 1);
  assert.deepEqual(result.roster.assignments.map((a) => a.crewId), ["z"]);
});

test("a vessel day becomes one duty per manned position, including preparation time", () => {
  const duties = dutiesForVesselDay("sule-lass", new Date("2025-04-07T07:00Z"), new Date("2025-04-07T18:00Z"), { master: 1, mate: 1, deckhand: 3 });
  assert.equal(duties.length, 5);
  assert.equal(duties[0].start.toISOString(), "2025-04-07T06:15:00.000Z");
});
