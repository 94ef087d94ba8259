import { dayInZone, instantOnDay, shiftDay } from "@/lib/format/dates";

/**
 * The demo sites' time zone. Both invented projects are in the US Central zone, the zone the demo
 * tablet records in, so the screens, reports and e-mails show the site's own clock.
 */
export const DEMO_TIME_ZONE = "America/Chicago";

/** A calendar day at the demo site relative to the day the demo is first seeded, as "YYYY-MM-DD". */
export function demoDay(today: Date, offsetDays: number): string {
  return shiftDay(dayInZone(today, DEMO_TIME_ZONE), offsetDays);
}

/** An instant at a time of day ("07:00" as 7 * 60 minutes) on a demo day, on the site's clock. */
export function demoInstant(day: string, minutes: number): Date {
  return instantOnDay(day, minutes, DEMO_TIME_ZONE);
}
