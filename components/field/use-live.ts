"use client";
import { formatDateTime, formatRecentDateTime } from "@/lib/format/dates";
import { useEffect, useState } from "react";

/** A clock that ticks, for "5 min ago" labels. */
export function useNow(intervalMs = 15_000): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const timer = window.setInterval(() => setNow(Date.now()), intervalMs);
    return () => window.clearInterval(timer);
  }, [intervalMs]);
  return now;
}

/** Whether the browser says it has a network, kept up to date. */
export function useOnline(): boolean {
  const [online, setOnline] = useState(true);
  useEffect(() => {
    const update = () => setOnline(navigator.onLine);
    update();
    window.addEventListener("online", update);
    window.addEventListener("offline", update);
    return () => {
      window.removeEventListener("online", update);
      window.removeEventListener("offline", update);
    };
  }, []);
  return online;
}

/**
 * A moment of the tablet's own (the last sync, which spans its projects), in the one date format;
 * written in the tablet's zone, since no single project's applies. Project dates use fieldTime.
 */
export function clockTime(iso: string | null | undefined): string {
  if (!iso) return "—";
  return formatDateTime(iso, tabletZone());
}

/** As `clockTime`, the date left out when it is today (the status bar has one line to hold it). */
export function recentClockTime(iso: string | null | undefined, now: number): string {
  if (!iso) return "—";
  return formatRecentDateTime(iso, tabletZone(), now);
}

const tabletZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone || "UTC";
