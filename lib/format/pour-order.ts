/**
 * The order the crew sees pours in, on the server's download list and the tablet's "Ready offline"
 * list alike: today's pours first (today on site, in each pour's project time zone), then the coming
 * ones nearest first, then the past ones most recent first, and pours with no planned stressing
 * date last. Pours on the same day keep a stable order by name (numbers in names read as numbers).
 */

export interface OrderedPour {
  /** "2026-12-02", the planned stressing day, or null when not planned. */
  plannedStressingDate: string | null;
  name: string;
}

/** 0 today, 1 coming, 2 past, 3 undated. */
function group(day: string | null, today: string): number {
  if (day === null || day === "") return 3;
  if (day === today) return 0;
  return day > today ? 1 : 2;
}

const byName = new Intl.Collator("en", { numeric: true, sensitivity: "base" });

/**
 * A new array of the pours in the crew's order. `todayOf` gives today's date ("yyyy-MM-dd") on the
 * site of a pour, e.g. `dayInZone(now, projectTimeZone(project))`, so a project in another zone
 * has its own today.
 */
export function orderPoursForCrew<T extends OrderedPour>(pours: readonly T[], todayOf: (pour: T) => string): T[] {
  const keyed = pours.map((pour) => {
    const today = todayOf(pour);
    return { pour, group: group(pour.plannedStressingDate, today), day: pour.plannedStressingDate ?? "" };
  });
  keyed.sort((a, b) => {
    if (a.group !== b.group) return a.group - b.group;
    // Coming: nearest first (ascending); past: most recent first (descending). ISO days compare as text.
    if (a.day !== b.day) return a.group === 1 ? a.day.localeCompare(b.day) : b.day.localeCompare(a.day);
    return byName.compare(a.pour.name, b.pour.name);
  });
  return keyed.map((k) => k.pour);
}
