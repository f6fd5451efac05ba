// One-off importer used in October 2024 to move crew rosters from the old spreadsheet into the
// roster builder. Kept for reference and for re-importing archived months. It vendors our date
// helpers (./vendor/dates.ts) because it is run with a bare TypeScript runner, outside the build.

import { readFileSync } from "node:fs";
import { parseClock, addMinutes, startOfDay } from "./vendor/dates.js";

export interface ImportedDuty {
  crewName: string;
  vessel: string;
  role: string;
  start: Date;
  end: Date;
}

export interface ImportReport {
  duties: ImportedDuty[];
  skipped: Array<{ line: number; reason: string }>;
}

const VESSELS: Record<string, string> = {
  "SULE LASS": "sule-lass",
  "KITTIWAKE": "kittiwake-dawn",
  "KITTIWAKE DAWN": "kittiwake-dawn",
  "BRANNAGH": "brannagh",
};

const ROLES: Record<string, string> = {
  MASTER: "master",
  SKIPPER: "master",
  MATE: "mate",
  ENG: "engineer",
  ENGINEER: "engineer",
  DH: "deckhand",
  DECKHAND: "deckhand",
  CATERING: "catering",
};

/** Columns: date (DD/MM/YYYY), name, vessel, role, on (HH:MM), off (HH:MM). */
export function parseRosterCsv(text: string): ImportReport {
  const report: ImportReport = { duties: [], skipped: [] };
  const lines = text.split(/\r?\n/);
  lines.forEach((raw, index) => {
    const line = index + 1;
    if (index === 0 || raw.trim() === "") return;
    const cells = raw.split(",").map((c) => c.trim());
    if (cells.length < 6) {
      report.skipped.push({ line, reason: "fewer than six columns" });
      return;
    }
    const [dateText, name, vesselText, roleText, on, off] = cells;
    const dateMatch = /^(\d{2})\/(\d{2})\/(\d{4})$/.exec(dateText);
    const vessel = VESSELS[vesselText.toUpperCase()];
    const role = ROLES[roleText.toUpperCase()];
    if (!dateMatch || !vessel || !role) {
      report.skipped.push({ line, reason: `unreadable date, vessel or role: ${dateText} ${vesselText} ${roleText}` });
      return;
    }
    const day = startOfDay(new Date(Date.UTC(Number(dateMatch[3]), Number(dateMatch[2]) - 1, Number(dateMatch[1]))));
    try {
      const start = addMinutes(day, parseClock(on));
      let end = addMinutes(day, parseClock(off));
      // Spreadsheet duties that finish after midnight were written with the next day's clock time.
      if (end <= start) end = addMinutes(end, 24 * 60);
      report.duties.push({ crewName: name, vessel, role, start, end });
    } catch (err) {
      report.skipped.push({ line, reason: (err as Error).message });
    }
  });
  return report;
}

if (process.argv[2]) {
  const report = parseRosterCsv(readFileSync(process.argv[2], "utf8"));
  console.log(`${report.duties.length} duties imported, ${report.skipped.length} lines skipped`);
  for (const s of report.skipped) console.log(`  line ${s.line}: ${s.reason}`);
}
