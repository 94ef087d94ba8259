"use client";

import {
  CartesianGrid,
  Legend,
  ReferenceLine,
  ResponsiveContainer,
  Scatter,
  ScatterChart,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";
import { VERDICT_MARKS } from "./deviation-chart";

/** Measured against predicted elongation, in display units, with the 1:1 line and the band. */

export interface ElongationPoint {
  tag: string;
  predicted: number;
  measured: number;
  verdict: "in band" | "long" | "short";
}

export function MeasuredPredictedChart({
  points,
  tolerancePct,
  unit,
}: {
  points: ElongationPoint[];
  tolerancePct: number;
  unit: string;
}) {
  const values = points.flatMap((p) => [p.predicted, p.measured]);
  const lo = Math.max(0, Math.floor(Math.min(...values) * 0.85));
  const hi = Math.ceil(Math.max(...values) * 1.1);
  const t = tolerancePct / 100;
  const line = (k: number): [{ x: number; y: number }, { x: number; y: number }] => [
    { x: lo, y: lo * k },
    { x: hi, y: hi * k },
  ];
  return (
    <figure>
      <div
        className="h-80 w-full"
        role="img"
        aria-label={`Measured against predicted elongation in ${unit}, with the equal line and the ±${tolerancePct} % band`}
        data-chart="measured-predicted"
      >
        <ResponsiveContainer width="100%" height="100%">
          <ScatterChart margin={{ top: 10, right: 48, bottom: 30, left: 16 }}>
            <CartesianGrid stroke="#c3c0b6" strokeDasharray="3 3" />
            <XAxis
              dataKey="predicted"
              type="number"
              domain={[lo, hi]}
              tickFormatter={(v: number) => v.toFixed(unit === "in" ? 1 : 0)}
              label={{ value: `predicted, ${unit}`, position: "insideBottom", offset: -18 }}
            />
            <YAxis
              dataKey="measured"
              type="number"
              domain={[lo, hi]}
              tickFormatter={(v: number) => v.toFixed(unit === "in" ? 1 : 0)}
              label={{ value: `measured, ${unit}`, angle: -90, position: "left", offset: 0 }}
            />
            <ReferenceLine segment={line(1)} stroke="#14213d" strokeWidth={2} ifOverflow="hidden" />
            <ReferenceLine segment={line(1 + t)} stroke="#14213d" strokeDasharray="6 4" ifOverflow="hidden" />
            <ReferenceLine segment={line(1 - t)} stroke="#14213d" strokeDasharray="6 4" ifOverflow="hidden" />
            <Tooltip
              content={({ payload }) => {
                const p = payload?.[0]?.payload as ElongationPoint | undefined;
                if (!p) return null;
                return (
                  <div className="rounded-md border-2 border-ink bg-white p-2 text-label">
                    <strong>{p.tag}</strong>: measured {p.measured.toFixed(2)} {unit}, predicted{" "}
                    {p.predicted.toFixed(2)} {unit}, {p.verdict}
                  </div>
                );
              }}
            />
            <Legend verticalAlign="top" />
            {(Object.keys(VERDICT_MARKS) as (keyof typeof VERDICT_MARKS)[]).map((v) => (
              <Scatter
                key={v}
                name={VERDICT_MARKS[v].name}
                data={points.filter((p) => p.verdict === v)}
                fill={VERDICT_MARKS[v].colour}
                shape={VERDICT_MARKS[v].shape}
                isAnimationActive={false}
              />
            ))}
          </ScatterChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-label text-ink-faint">
        Solid line: measured equals predicted. Dashed: the ±{tolerancePct} % band.
      </figcaption>
    </figure>
  );
}
