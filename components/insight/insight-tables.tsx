import { showModulus, showNumber, showPct, showPctPoints, showShare, type DisplayUnits } from "@/lib/format/quantities";
import { LineIcon } from "@/components/ui/mark";
import type { ApparentModulus, ResolutionShare, SetDrift } from "@/lib/insights";

/** The insight page's tables: plain server-rendered markup, numbers in tabular figures. */

export function DriftTable({ caption, sets }: { caption: string; sets: SetDrift[] }) {
  if (!sets.length)
    return <p className="card">{caption}: no tendon is complete yet, so there is nothing to compare.</p>;
  return (
    <div className="overflow-x-auto" tabIndex={0} role="region" aria-label={`${caption}, scrolls sideways`}>
      <table className="w-full border-collapse text-left" data-table="drift">
        <caption className="mb-2 text-left text-lead font-semibold">{caption}</caption>
        <thead>
          <tr className="border-b-2 border-ink">
            <th className="p-2">Equipment set</th>
            <th className="p-2 text-right">Tendons</th>
            <th className="p-2 text-right">Mean deviation</th>
            <th className="p-2 text-right">Spread (sd)</th>
            <th className="p-2 text-right">Other sets</th>
            <th className="p-2">Drift</th>
          </tr>
        </thead>
        <tbody>
          {sets.map((s) => (
            <tr
              key={s.setId}
              className="border-b border-concrete-300 align-top"
              data-set={s.setName}
              data-drifting={s.drifting}
            >
              <th scope="row" className="p-2 font-semibold">
                {s.setName}
              </th>
              <td className="whitespace-nowrap p-2 text-right tabular-nums">{s.n}</td>
              <td className="whitespace-nowrap p-2 text-right tabular-nums">
                {showPct(s.meanPct)} <span className="text-label text-ink-faint">± {showNumber(s.sePct, 1)}</span>
              </td>
              <td className="whitespace-nowrap p-2 text-right tabular-nums">{showPctPoints(s.sdPct)}</td>
              <td className="whitespace-nowrap p-2 text-right tabular-nums">
                {s.others ? `${showPct(s.others.meanPct)} (${s.others.n})` : "—"}
              </td>
              <td className="p-2">
                {s.drifting ? (
                  <span className="inline-flex items-center gap-2 rounded-md border-2 border-signal-stop bg-signal-stop-bg px-2 font-bold text-signal-stop">
                    <LineIcon d="M12 2 L23 21 H1 Z" className="h-4 w-4" weight={2.5} />
                    Drifting
                  </span>
                ) : (
                  <span className="font-semibold">No drift seen</span>
                )}
                <p className="mt-1 text-label text-ink-soft">{s.note}</p>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function ModulusTable({
  moduli,
  project,
}: {
  moduli: ApparentModulus[];
  /** The project's units: the moduli show in ksi on a US project, GPa on an SI one. */
  project: Pick<DisplayUnits, "unitSystem">;
}) {
  if (!moduli.length)
    return (
      <p className="card">
        No record on this pour was read at several gauge steps, so there is no apparent modulus to show.
      </p>
    );
  return (
    <div
      className="overflow-x-auto"
      tabIndex={0}
      role="region"
      aria-label="Apparent modulus per tendon end, scrolls sideways"
    >
      <table className="w-full border-collapse text-left" data-table="modulus">
        <thead>
          <tr className="border-b-2 border-ink">
            <th className="p-2">Tendon, end</th>
            <th className="p-2 text-right">Steps</th>
            <th className="p-2 text-right">Apparent modulus</th>
            <th className="p-2 text-right">Mill value</th>
            <th className="p-2 text-right">Ratio</th>
            <th className="p-2 text-right">r²</th>
          </tr>
        </thead>
        <tbody>
          {moduli.map((m) => (
            <tr key={`${m.tag}-${m.end}`} className="border-b border-concrete-300">
              <th scope="row" className="p-2 font-semibold">
                {m.tag}, end {m.end}
              </th>
              <td className="whitespace-nowrap p-2 text-right tabular-nums">{m.steps}</td>
              {"problem" in m ? (
                <td className="p-2" colSpan={4}>
                  {m.problem}
                </td>
              ) : (
                <>
                  <td className="whitespace-nowrap p-2 text-right tabular-nums">
                    {showModulus(project, m.apparentModulusMPa)}
                  </td>
                  <td className="whitespace-nowrap p-2 text-right tabular-nums">
                    {m.millModulusMPa ? showModulus(project, m.millModulusMPa) : "—"}
                  </td>
                  <td className="whitespace-nowrap p-2 text-right tabular-nums">
                    {m.modulusRatio ? showNumber(m.modulusRatio, 3) : "—"}
                  </td>
                  <td className="whitespace-nowrap p-2 text-right tabular-nums">{showNumber(m.r2, 4)}</td>
                </>
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function ResolutionSummary({ resolution, division }: { resolution: ResolutionShare; division: string }) {
  if (!resolution.all.n)
    return (
      <p className="card">No tendon is complete yet, so no verdict can be weighed against the reading division.</p>
    );
  return (
    <div className="card space-y-2" data-table="resolution">
      <p>
        <strong className="tabular-nums">{showShare(resolution.short.share)}</strong> of short tendons (
        {resolution.short.couldChange} of {resolution.short.n}) and{" "}
        <strong className="tabular-nums">{showShare(resolution.all.share)}</strong> of all complete tendons (
        {resolution.all.couldChange} of {resolution.all.n}) have a verdict that the reading division ({division}) alone
        could change: half a division either way on each end read crosses a band edge.
      </p>
      <p className="text-label text-ink-soft">
        Short here means a band narrower than four reading divisions. A finer division, or a second reading, settles
        these.
      </p>
      {resolution.tendons.length > 0 && (
        <p>Tendons: {resolution.tendons.map((t) => `${t.tag}${t.short ? " (short)" : ""}`).join(", ")}</p>
      )}
    </div>
  );
}
