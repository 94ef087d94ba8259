import { LineIcon } from "@/components/ui/mark";
import { flagLabel } from "@/components/ui/verdict-badge";
import { formatDateTime } from "@/lib/format/dates";
import { holdsOf } from "@/lib/offline/hold-view";
import type { FieldFlag, FieldTendon } from "@/lib/schemas/sync";
import { DetensionPanel } from "./detension";
import { LiftoffCheckPanel } from "./liftoff-check";

/**
 * Above the verdict: why the tendon is held and what to do, in words, from the flags and the
 * engineer's decisions of the last sync. A tendon the tablet's own check finds out of band, with
 * no flag from the server yet, is held too.
 */
export function HoldPanel({
  flags,
  heldOnTablet,
  tendon,
  timeZone,
}: {
  flags: FieldFlag[];
  heldOnTablet: boolean;
  /** The project's time zone, for the date of the engineer's instruction. */
  timeZone: string;
  /**
   * Given, a lift-off check the engineer ordered opens here (components/field/liftoff-check.tsx), and
   * a detension (components/field/detension.tsx).
   */
  tendon?: FieldTendon;
}) {
  const holds = holdsOf(flags);
  if (!holds.length && !heldOnTablet) return null;
  return (
    <section
      aria-label="Held"
      className="grid gap-3 rounded-md border-4 border-signal-stop bg-signal-stop-bg p-4 text-ink"
      data-testid="hold-panel"
    >
      <h3 className="flex items-center gap-2 text-lead font-bold text-signal-stop">
        <LineIcon d="M6 3v18M6 4h11l-3 4 3 4H6" className="h-7 w-7 shrink-0" />
        Held: do not cut tails
      </h3>
      {!holds.length && (
        <p className="font-semibold">
          This tablet&apos;s own check puts the tendon out of band. The server judges it when the record is sent; wait
          for its verdict and the engineer&apos;s decision.
        </p>
      )}
      <ul className="grid gap-3">
        {holds.map((h) => (
          <li
            key={h.flagId}
            className="grid gap-1 rounded-md border-2 border-signal-stop bg-white p-3"
            data-testid="hold"
            data-kind={h.kind}
          >
            <p className="font-bold">
              {flagLabel(h.kind)}
              {h.status === "with_engineer" ? " · with the engineer" : ""}
            </p>
            <p data-testid="hold-why">{h.reason ?? "The reason arrives with the next sync."}</p>
            {h.decision && (
              <p data-testid="hold-instruction">
                <strong>Engineer&apos;s instruction</strong> ({h.decision.engineerName},{" "}
                {formatDateTime(h.decision.createdAt, timeZone)}): {h.decision.reasons}
              </p>
            )}
            <p className="font-bold" data-testid="hold-what-to-do">
              What to do: {h.instruction}
            </p>
            {tendon && h.decision?.decision === "liftoff_check" && <LiftoffCheckPanel tendon={tendon} hold={h} />}
            {tendon && h.decision?.decision === "detension_restress" && <DetensionPanel tendon={tendon} hold={h} />}
          </li>
        ))}
      </ul>
    </section>
  );
}
