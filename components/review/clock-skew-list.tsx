import Link from "next/link";
import { countOf } from "@/lib/format/count";
import { formatDateTime, formatSpan } from "@/lib/format/dates";
import type { SkewedRecord } from "@/lib/server/find-clock-skews";

/** The difference between the two times in words, with its direction. */
function differenceInWords(r: SkewedRecord): string {
  const span = formatSpan(r.deviceTime, r.receivedAt);
  return r.skew.future
    ? `The tablet's time is ${span} after the server received it: the tablet's clock is ahead.`
    : r.skew.minutes > 0
      ? `The tablet's time is ${span} after the server received it.`
      : `The tablet's time is ${span} before the server received it: a slow clock, or a record sent late after a shift without signal.`;
}

/**
 * Every record whose tablet time is far from the server's receipt, on pours not yet released,
 * flagged tendon or not: tendon, end, both times in the project's zone and the difference in words.
 */
export function ClockSkewList({ records }: { records: SkewedRecord[] }) {
  return (
    <section aria-labelledby="clock-skew-heading" className="space-y-3" data-clock-skew-list>
      <h2 id="clock-skew-heading" className="text-lead font-bold">
        Times to check
      </h2>
      <p className="text-ink-soft">
        Records on pours not yet released whose tablet time differs from when the server received them by more than the
        project&apos;s threshold, or lies after it. The project and pour filters apply here; the flag and age filters do
        not.
      </p>
      {records.length === 0 ? (
        <p className="card">No record to check: every tablet time is within the threshold.</p>
      ) : (
        <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Times to check, scrolls sideways">
          <table className="w-full min-w-[44rem] bg-white">
            <caption className="sr-only">{countOf(records.length, "record")} with a time to check</caption>
            <thead>
              <tr className="border-b-2 border-ink text-left text-label uppercase">
                <th className="p-2">Tendon</th>
                <th className="p-2">End</th>
                <th className="p-2">Tablet time</th>
                <th className="p-2">Server received</th>
                <th className="p-2">Difference</th>
              </tr>
            </thead>
            <tbody className="tabular-nums">
              {records.map((r) => (
                <tr key={r.recordId} className="border-b border-concrete-200 align-top" data-skewed-record={r.recordId}>
                  <td className="p-2">
                    <span className="block text-label uppercase text-ink-faint">
                      {r.projectName} · {r.pourName}
                    </span>
                    <Link
                      href={`/projects/${r.projectId}/tendons/${r.tendonId}/flags`}
                      prefetch={false}
                      className="font-bold underline underline-offset-2"
                    >
                      Tendon {r.tag}
                    </Link>
                  </td>
                  <td className="p-2 font-bold">{r.end}</td>
                  <td className="whitespace-nowrap p-2">{formatDateTime(r.deviceTime, r.timeZone)}</td>
                  <td className="whitespace-nowrap p-2">{formatDateTime(r.receivedAt, r.timeZone)}</td>
                  <td className="border-l-4 border-signal-stop p-2">{differenceInWords(r)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
