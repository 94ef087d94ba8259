import { dayInZone, formatDateTime, instantOnDay, shiftDay } from "@/lib/format/dates";

/**
 * The project's shifts: each ends at a local time of day in the project's time zone (minutes
 * after midnight, at most four a day, default one at 18:00). A shift runs from one end to the
 * next, so with one end a day a shift is the 24 hours up to 18:00; with 06:00 and 18:00 there is
 * a day shift and a night shift. On a daylight-saving change a shift is an hour shorter or longer,
 * because the ends stay at the same local times.
 */

export const DEFAULT_SHIFT_ENDS = [18 * 60] as const;
export const MAX_SHIFT_ENDS = 4;

/** "18:00" for 1080. */
export function formatShiftEnd(minutes: number): string {
  return `${String(Math.floor(minutes / 60)).padStart(2, "0")}:${String(minutes % 60).padStart(2, "0")}`;
}

/**
 * Reads shift ends as typed ("18:00", "6:00, 18:00", "06:30 18:30"): sorted minutes after
 * midnight, or a message saying what is wrong.
 */
export function parseShiftEnds(typed: string): { ends: number[] } | { error: string } {
  const parts = typed
    .split(/[\s,;]+/)
    .map((p) => p.trim())
    .filter(Boolean);
  if (!parts.length) return { error: "Give at least one shift end, e.g. 18:00." };
  const ends: number[] = [];
  for (const part of parts) {
    const m = /^([01]?\d|2[0-3]):([0-5]\d)$/.exec(part);
    if (!m) return { error: `"${part}" is not a time of day: write it as hours and minutes, e.g. 18:00.` };
    ends.push(Number(m[1]) * 60 + Number(m[2]));
  }
  const unique = [...new Set(ends)].sort((a, b) => a - b);
  if (unique.length !== ends.length) return { error: "A shift end is given twice." };
  if (unique.length > MAX_SHIFT_ENDS) return { error: `At most ${MAX_SHIFT_ENDS} shift ends a day.` };
  return { ends: unique };
}

/** Every shift end on the days around an instant, oldest first. */
function endsAround(now: Date, timeZone: string, ends: readonly number[]): Date[] {
  const today = dayInZone(now, timeZone);
  return [-2, -1, 0, 1]
    .flatMap((by) => ends.map((m) => instantOnDay(shiftDay(today, by), m, timeZone)))
    .sort((a, b) => +a - +b);
}

/** The shift that ended last at or before `now`: from the end before it to its own end. */
export function lastEndedShift(now: Date, timeZone: string, ends: readonly number[]): { start: Date; end: Date } {
  if (!ends.length) throw new Error("A project has at least one shift end.");
  const all = endsAround(now, timeZone, ends);
  const i = all.findLastIndex((e) => +e <= +now);
  // With ends on each of two earlier days, i ≥ 1 always.
  return { start: all[i - 1]!, end: all[i]! };
}

/** The shift end after `now` (strictly). */
export function nextShiftEnd(now: Date, timeZone: string, ends: readonly number[]): Date {
  return endsAround(now, timeZone, ends).find((e) => +e > +now)!;
}

/** "2026-12-02 06:00 CST to 2026-12-02 18:00 CST". */
export function shiftWords(window: { start: Date; end: Date }, timeZone: string): string {
  return `${formatDateTime(window.start, timeZone)} to ${formatDateTime(window.end, timeZone)}`;
}
