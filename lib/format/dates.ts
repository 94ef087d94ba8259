import { TZDate } from "@date-fns/tz";
import {
  addDays,
  format,
  formatDistanceStrict,
  formatDuration,
  intervalToDuration,
  type FormatDistanceToken,
  type Locale,
} from "date-fns";
import { enUS } from "date-fns/locale/en-US";

/**
 * The one way Tautline writes dates and times, always in the project's time zone (an IANA name such
 * as "America/Chicago"). Screens, e-mails and reports call these; nothing formats a date by hand.
 */

type Instant = Date | string | number;

function inZone(instant: Instant, timeZone: string): TZDate {
  return new TZDate(new Date(instant).getTime(), timeZone);
}

/** "2026-12-02": the stressing day, calibration days, report dates. */
export function formatDay(instant: Instant, timeZone: string): string {
  return format(inZone(instant, timeZone), "yyyy-MM-dd");
}

/** "2026-12-02 14:05 CST": a moment, with the zone's abbreviation so nobody guesses. */
export function formatDateTime(instant: Instant, timeZone: string): string {
  return `${format(inZone(instant, timeZone), "yyyy-MM-dd HH:mm")} ${zoneName(instant, timeZone)}`;
}

/**
 * "14:05 CST" for a moment of the same day as `now` in the zone, else as `formatDateTime`: where
 * room is short and the moment is usually recent (the tablet's last sync).
 */
export function formatRecentDateTime(instant: Instant, timeZone: string, now: Instant = Date.now()): string {
  if (formatDay(instant, timeZone) !== formatDay(now, timeZone)) return formatDateTime(instant, timeZone);
  return `${format(inZone(instant, timeZone), "HH:mm")} ${zoneName(instant, timeZone)}`;
}

/** The zone's short name at that moment ("CST", "CDT"; "UTC+1" where no short name is in use). */
export function zoneName(instant: Instant, timeZone: string): string {
  const part = new Intl.DateTimeFormat("en-US", { timeZone, timeZoneName: "short" })
    .formatToParts(new Date(instant))
    .find((p) => p.type === "timeZoneName");
  return (part?.value ?? timeZone).replace(/^GMT(?=[+-])/, "UTC").replace(/^GMT$/, "UTC");
}

/** "3 hours ago", "in 2 days": ages of flags, outboxes and syncs. */
export function formatAge(instant: Instant, now: Instant = Date.now()): string {
  return formatDistanceStrict(new Date(instant), new Date(now), { addSuffix: true });
}

/**
 * "32 minutes", "1 hour 5 minutes", "2 days 3 hours": the span between two moments in words, to the
 * minute, without a direction (whichever comes first). "under a minute" below one.
 */
export function formatSpan(a: Instant, b: Instant): string {
  const [start, end] = [new Date(a), new Date(b)].sort((x, y) => x.getTime() - y.getTime()) as [Date, Date];
  const words = formatDuration(intervalToDuration({ start, end }), {
    format: ["years", "months", "days", "hours", "minutes"],
  });
  return words || "under a minute";
}

const SHORT_UNITS: Partial<Record<FormatDistanceToken, string>> = {
  xMinutes: "min",
  xHours: "h",
  xDays: "d",
  xMonths: "mo",
  xYears: "y",
};

/** English with short units ("5 min", "2 h", "3 d") and "just now" below a minute. */
const shortAges: Locale = {
  ...enUS,
  formatDistance: (token, count, options) => {
    const unit = SHORT_UNITS[token];
    if (!unit) return "just now";
    const distance = `${count} ${unit}`;
    if (!options?.addSuffix) return distance;
    return options.comparison !== undefined && options.comparison > 0 ? `in ${distance}` : `${distance} ago`;
  },
};

/**
 * "just now", "5 min ago", "2 h ago", "3 d ago": `formatAge` in short units, where one line holds it
 * (the tablet's status bar at 800 px). Counted down to the unit (59 min is not yet "1 h"); a moment
 * after `now`, as a clock a little ahead would give, is "just now".
 */
export function formatShortAge(instant: Instant, now: Instant = Date.now()): string {
  const at = Math.min(new Date(instant).getTime(), new Date(now).getTime());
  return formatDistanceStrict(at, new Date(now), { addSuffix: true, locale: shortAges, roundingMethod: "floor" });
}

/** The calendar day of an instant in a time zone ("2026-12-02"): the stressing day on tablet and server. */
export function dayInZone(instant: Instant, timeZone: string): string {
  return formatDay(instant, timeZone);
}

/**
 * The latest calendar day anywhere on Earth at that moment (the day at UTC+14): a date after it
 * has not begun in any time zone, so no certificate can carry it yet.
 */
export function latestDayAnywhere(now: Instant = Date.now()): string {
  return formatDay(now, "Pacific/Kiritimati");
}

/**
 * The time zone a project's dates and times are shown in: its `time_zone` (a projects row) or
 * `timeZone` (its settings), "UTC" when neither is given.
 */
export function projectTimeZone(project: { time_zone?: string | null; timeZone?: string | null }): string {
  const zone = project.time_zone ?? project.timeZone;
  return typeof zone === "string" && zone !== "" ? zone : "UTC";
}

/**
 * The instants a calendar day ("2026-12-02") spans in a time zone: from its first moment to the
 * first moment of the next day (exclusive), so a day of a daylight-saving change is 23 or 25 hours.
 */
export function dayBounds(day: string, timeZone: string): { start: Date; end: Date } {
  const [y, m, d] = day.split("-").map(Number) as [number, number, number];
  return {
    start: new Date(new TZDate(y, m - 1, d, timeZone).getTime()),
    end: new Date(new TZDate(y, m - 1, d + 1, timeZone).getTime()),
  };
}

/** The calendar day `by` days after (or before, when negative) a day: "2026-12-02", -1 → "2026-12-01". */
export function shiftDay(day: string, by: number): string {
  const [y, m, d] = day.split("-").map(Number) as [number, number, number];
  return format(addDays(new Date(y, m - 1, d), by), "yyyy-MM-dd");
}

/** "2026-12-02T14:05": a moment as a `datetime-local` box shows it, in the project's zone. */
export function localInputValue(instant: Instant, timeZone: string): string {
  return format(inZone(instant, timeZone), "yyyy-MM-dd'T'HH:mm");
}

/**
 * The instant a `datetime-local` box's value ("2026-12-02T14:05") names in the project's zone; null
 * when the value is not such a date and time.
 */
export function instantFromLocalInput(value: string, timeZone: string): Date | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(value.trim());
  if (!m) return null;
  const [y, mo, d, h, mi] = m.slice(1).map(Number) as [number, number, number, number, number];
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || h > 23 || mi > 59) return null;
  const instant = new Date(new TZDate(y, mo - 1, d, h, mi, timeZone).getTime());
  // A day past the month's end (31 June) rolls over: refuse it rather than move it.
  return localInputValue(instant, timeZone) === value.trim() ? instant : null;
}

/**
 * The instant a local time of day ("minutes" after midnight) falls on a calendar day in a time
 * zone. A time the clocks skip on a spring-forward day comes out as the instant just after the jump.
 */
export function instantOnDay(day: string, minutes: number, timeZone: string): Date {
  const [y, m, d] = day.split("-").map(Number) as [number, number, number];
  return new Date(new TZDate(y, m - 1, d, Math.floor(minutes / 60), minutes % 60, timeZone).getTime());
}
