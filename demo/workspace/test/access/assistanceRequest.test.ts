import { test } from "node:test";
import assert from "node:assert/strict";
import { AssistanceRegister } from "../../src/access/assistanceRequest.js";
import { delayMessages, inclinePhoneTasks } from "../../src/access/assistanceNotifications.js";

const now = new Date("2025-04-10T10:00Z");
const departure = new Date("2025-04-14T09:00Z");

function register() {
  return new AssistanceRegister(() => now);
}

test("requests made more than two days ahead are not short notice", () => {
  const r = register().create({ bookingReference: "OS-AAAAAA", sailingId: "s1", departure, needs: ["wheelchair-manual"], ownWords: "", companion: false });
  assert.equal(r.shortNotice, false);
});

test("requests on the day are accepted and marked short notice", () => {
  const r = register().create({ bookingReference: "OS-BBBBBB", sailingId: "s1", departure: new Date("2025-04-10T15:00Z"), needs: [], ownWords: "steady arm please", companion: false });
  assert.equal(r.shortNotice, true);
  assert.deepEqual(r.needs, ["other"]);
});

test("a red incline asks the duty officer to phone chair and scooter users", () => {
  const reg = register();
  reg.create({ bookingReference: "OS-CCCCCC", sailingId: "s2", departure, needs: ["mobility-scooter"], ownWords: "", companion: false, mobile: "07000000001" });
  const [item] = reg.review("s2", "sule-lass", "red");
  assert.match(item.actions[0], /steeper than 1 in 8/);
});

test("lounge chair spaces run out after two", () => {
  const reg = register();
  for (const ref of ["A", "B", "C"]) {
    reg.create({ bookingReference: ref, sailingId: "s3", departure, needs: ["wheelchair-manual"], ownWords: "", companion: false, mobile: "07000000002" });
  }
  const items = reg.review("s3", "kittiwake-dawn", "green");
  assert.equal(items.filter((i) => i.request.loungeSpaceHeld).length, 2);
  assert.ok(items[2].actions.some((a) => a.includes("no lounge chair space")));
});

test("powered chairs on the Brannagh go to the heated vehicle-deck seating", () => {
  const reg = register();
  reg.create({ bookingReference: "OS-DDDDDD", sailingId: "s4", departure, needs: ["wheelchair-powered"], ownWords: "", companion: true, mobile: "07000000003" });
  const [item] = reg.review("s4", "brannagh", "green");
  assert.ok(item.actions[0].includes("vehicle-deck seating"));
  assert.equal(item.request.loungeSpaceHeld, false);
});

test("the muster list shows who embarks first and who has a companion", () => {
  const reg = register();
  reg.create({ bookingReference: "OS-EEEEEE", sailingId: "s5", departure, needs: ["sight-loss", "assistance-dog"], ownWords: "", companion: true });
  reg.create({ bookingReference: "OS-FFFFFF", sailingId: "s5", departure, needs: ["hearing-loss"], ownWords: "", companion: false });
  assert.deepEqual(reg.musterList("s5"), [
    "OS-EEEEEE: sight-loss, assistance-dog + companion (embark first)",
    "OS-FFFFFF: hearing-loss (normal)",
  ]);
});

test("delay texts go only to passengers with hearing or sight loss and only past fifteen minutes", () => {
  const reg = register();
  reg.create({ bookingReference: "G", sailingId: "s6", departure, needs: ["hearing-loss"], ownWords: "", companion: false, mobile: "07000000004" });
  reg.create({ bookingReference: "H", sailingId: "s6", departure, needs: ["walking-aid"], ownWords: "", companion: false, mobile: "07000000005" });
  assert.equal(delayMessages(reg.forSailing("s6"), 10, "09:10").length, 0);
  assert.equal(delayMessages(reg.forSailing("s6"), 30, "09:30").length, 1);
  assert.equal(inclinePhoneTasks(reg.forSailing("s6"), "red").length, 1);
});
