// Small date helpers shared across the service. All times are handled as UTC instants and
// converted to local harbour time only for display. Keep this file dependency-free: it is
// vendored into tools that do not share our build.

export const MINUTE_MS = 60_000;
export const HOUR_MS = 60 * MINUTE_MS;
export const DAY_MS = 24 * HOUR_MS;

/** Minutes since local midnight, as used in timetable files ("07:45" -> 465). */
export function parseClock(text: string): number {
  const match = /^(\d{1,2}):(\d{2})$/.exec(text.trim());
  if (!match) {
    throw new Error(`Not a clock time: "${text}"`);
  }
  const hours = Number(match[1]);
  const minutes = Number(match[2]);
  if (hours > 23 || minutes > 59) {
    throw new Error(`Clock time out of range: "${text}"`);
  }
  return hours * 60 + minutes;
}

/** Formats minutes since midnight back to "HH:MM". */
export function formatClock(minutesSinceMidnight: number): string {
  const wrapped = ((minutesSinceMidnight % 1440) + 1440) % 1440;
  const hours = Math.floor(wrapped / 60);
  const minutes = wrapped % 60;
  return `${String(hours).padStart(2, "0")}:${String(minutes).padStart(2, "0")}`;
}

/** ISO date (YYYY-MM-DD) of an instant, in UTC. */
export function isoDate(instant: Date): string {
  return instant.toISOString().slice(0, 10);
}

/** Start of the UTC day containing the instant. */
export function startOfDay(instant: Date): Date {
  return new Date(Date.UTC(instant.getUTCFullYear(), instant.getUTCMonth(), instant.getUTCDate()));
}

export function addMinutes(instant: Date, minutes: number): Date {
  return new Date(instant.getTime() + minutes * MINUTE_MS);
}

export function addDays(instant: Date, days: number): Date {
  return new Date(instant.getTime() + days * DAY_MS);
}

/** Whole minutes from a to b (negative when b is earlier). */
export function minutesBetween(a: Date, b: Date): number {
  return Math.round((b.getTime() - a.getTime()) / MINUTE_MS);
}

/** Hours between two instants, as a fraction. */
export function hoursBetween(a: Date, b: Date): number {
  return (b.getTime() - a.getTime()) / HOUR_MS;
}

/** True when the two intervals overlap by at least one minute. */
export function overlaps(aStart: Date, aEnd: Date, bStart: Date, bEnd: Date): boolean {
  return aStart.getTime() < bEnd.getTime() - MINUTE_MS + 1 && bStart.getTime() < aEnd.getTime() - MINUTE_MS + 1;
}

/** Day of week with Monday = 0, matching how the timetable files are written. */
export function weekdayIndex(instant: Date): number {
  return (instant.getUTCDay() + 6) % 7;
}

export const WEEKDAY_NAMES = ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"] as const;
export type WeekdayName = (typeof WEEKDAY_NAMES)[number];

export function weekdayName(instant: Date): WeekdayName {
  return WEEKDAY_NAMES[weekdayIndex(instant)];
}
