import { ticks as niceTicks } from "d3-array";
import type { ForceProfile } from "@/lib/elongation";

/**
 * The force along the tendon at jacking and after seating, drawn as plain SVG (no script), with
 * the anchor-set zones shaded where the two lines differ.
 */
export function ForceProfileChart({
  profile,
  formatForce,
  formatLength,
  newtonsPerUnit,
}: {
  profile: ForceProfile;
  formatForce: (n: number) => string;
  formatLength: (mm: number) => string;
  /** Newtons in one unit of the axis (4448.2216 for kip, 1000 for kN), so the ticks fall on round numbers of it. */
  newtonsPerUnit: number;
}) {
  const W = 720;
  const H = 240;
  const pad = { l: 72, r: 16, t: 16, b: 40 };
  const forces = profile.points.flatMap((p) => [p.jackingN, p.afterSeatingN]);
  const max = Math.max(...forces);
  const min = Math.min(...forces);
  const lo = min - (max - min) * 0.1;
  const hi = max + (max - min) * 0.05 || max * 1.01;
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
  // Round numbers in the unit shown (d3-array's ticks: 1, 2 or 5 times a power of ten apart).
  const ticks = niceTicks(lo / newtonsPerUnit, hi / newtonsPerUnit, 4)
    .map((t) => t * newtonsPerUnit)
    .filter((t) => t >= lo && t <= hi);

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
          <g key={t}>
            <line x1={pad.l - 4} x2={pad.l} y1={y(t)} y2={y(t)} stroke="#44433d" />
            <text x={pad.l - 6} y={y(t) + 4} textAnchor="end" fontSize="12" fill="#2b3a5c">
              {formatForce(t)}
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
