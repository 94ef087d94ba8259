import type { ForceProfile } from "@/lib/elongation";
import { niceAxis } from "@/lib/format/axis";
import { displayUnit, fromDisplayUnit, inDisplayUnit, showNumber, type DisplayUnits } from "@/lib/format/quantities";

/**
 * The force along the tendon at jacking and after seating, drawn as plain SVG (no script), with
 * the anchor-set zones shaded where the two lines differ.
 */
export function ForceProfileChart({
  profile,
  project,
  formatLength,
}: {
  profile: ForceProfile;
  /** The project's units: the force axis is in kip or kN, its ticks on round numbers of that unit. */
  project: Pick<DisplayUnits, "unitSystem">;
  formatLength: (mm: number) => string;
}) {
  const W = 720;
  const H = 240;
  const pad = { l: 72, r: 16, t: 16, b: 40 };
  const forces = profile.points.flatMap((p) => [p.jackingN, p.afterSeatingN]);
  const max = Math.max(...forces);
  const min = Math.min(...forces);
  // Round numbers in the unit shown, the axis widened to the ticks at either end.
  const axis = niceAxis(
    inDisplayUnit(project, "force", min - (max - min) * 0.1),
    inDisplayUnit(project, "force", max + (max - min) * 0.05 || max * 1.01),
    4,
  );
  const [lo, hi] = axis.domain.map((v) => fromDisplayUnit(project, "force", v)) as [number, number];
  const ticks = axis.ticks.map((t) => ({
    n: fromDisplayUnit(project, "force", t),
    label: showNumber(t, axis.decimals),
  }));
  const unit = displayUnit(project, "force");
  const x = (mm: number) => pad.l + (mm / profile.lengthMm) * (W - pad.l - pad.r);
  const y = (n: number) => pad.t + (1 - (n - lo) / (hi - lo)) * (H - pad.t - pad.b);
  const line = (key: "jackingN" | "afterSeatingN") =>
    profile.points.map((p) => `${x(p.xMm).toFixed(1)},${y(p[key]).toFixed(1)}`).join(" ");
  const zones: [number, number][] = [];
  let start: number | null = null;
  for (const p of profile.points) {
    const inZone = p.jackingN - p.afterSeatingN > 1;
    if (inZone && start === null) start = p.xMm;
    if (!inZone && start !== null) {
      zones.push([start, p.xMm]);
      start = null;
    }
  }
  if (start !== null) zones.push([start, profile.lengthMm]);

  return (
    <figure>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="w-full"
        role="img"
        aria-label="Force along the tendon at jacking and after seating"
      >
        {zones.map(([a, b]) => (
          <rect key={a} x={x(a)} y={pad.t} width={Math.max(1, x(b) - x(a))} height={H - pad.t - pad.b} fill="#dcdad3" />
        ))}
        <line x1={pad.l} x2={W - pad.r} y1={H - pad.b} y2={H - pad.b} stroke="#44433d" />
        <line x1={pad.l} x2={pad.l} y1={pad.t} y2={H - pad.b} stroke="#44433d" />
        {ticks.map((t) => (
          <g key={t.label}>
            <line x1={pad.l - 4} x2={pad.l} y1={y(t.n)} y2={y(t.n)} stroke="#44433d" />
            <text x={pad.l - 6} y={y(t.n) + 4} textAnchor="end" fontSize="12" fill="#2b3a5c">
              {t.label} {unit}
            </text>
          </g>
        ))}
        <text x={pad.l} y={H - 14} fontSize="12" fill="#2b3a5c">
          End A
        </text>
        <text x={W - pad.r} y={H - 14} fontSize="12" textAnchor="end" fill="#2b3a5c">
          End B · {formatLength(profile.lengthMm)}
        </text>
        <polyline points={line("jackingN")} fill="none" stroke="#14213d" strokeWidth="2.5" />
        <polyline points={line("afterSeatingN")} fill="none" stroke="#8a4b00" strokeWidth="2.5" strokeDasharray="7 4" />
      </svg>
      <figcaption className="mt-2 flex flex-wrap gap-4 text-label">
        <span>━ at jacking</span>
        <span>╍ after seating</span>
        <span>▒ anchor-set zone</span>
      </figcaption>
    </figure>
  );
}
