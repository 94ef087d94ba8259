/**
 * Clock skew of a record: how far the tablet's clock (the record's device time) was from the
 * server's when the record arrived. A record that arrived late after an offline shift is normal:
 * its receipt is simply later than its device time, so the project threshold (default 10 minutes)
 * applies in both directions and a long offline wait shows as skew too. The inspector judges which
 * it was from the two times, which every screen shows side by side. A device time after its own
 * receipt is impossible with a right clock and is marked once it is more than FUTURE_GRACE_MS ahead
 * (network delay and clock jitter of a synced device stay well below a minute; common practice).
 */
export const DEFAULT_CLOCK_SKEW_MINUTES = 10;
export const FUTURE_GRACE_MS = 60_000;

export interface ClockSkew {
  /** Device time minus receipt time, in minutes (negative: the device time is earlier). */
  minutes: number;
  /** The device time lies after the server received the record. */
  future: boolean;
}

type Instant = Date | string | number;

/** The skew of a record when it is worth the inspector's attention, else null. */
export function clockSkew(
  deviceTime: Instant,
  receivedAt: Instant,
  thresholdMinutes: number = DEFAULT_CLOCK_SKEW_MINUTES,
): ClockSkew | null {
  const device = new Date(deviceTime).getTime();
  const received = new Date(receivedAt).getTime();
  if (!Number.isFinite(device) || !Number.isFinite(received)) return null;
  const diff = device - received;
  const future = diff > FUTURE_GRACE_MS;
  if (!future && Math.abs(diff) <= thresholdMinutes * 60_000) return null;
  return { minutes: diff / 60_000, future };
}
