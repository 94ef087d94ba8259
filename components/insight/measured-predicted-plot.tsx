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
import { niceAxis } from "@/lib/format/axis";
import { showNumber } from "@/lib/format/quantities";
import { VERDICT_MARKS, type ElongationPoint } from "./verdict-marks";

/** The measured-against-predicted chart's drawing (recharts), loaded only where the chart is shown. */
export function MeasuredPredictedPlot({
  points,
  tolerancePct,
  unit,
}: {
  points: ElongationPoint[];
  tolerancePct: number;
  unit: string;
}) {
  const values = points.flatMap((p) => [p.predicted, p.measured]);
  // Both axes alike, on round values of the unit shown, so the equal line runs corner to corner.
  const axis = niceAxis(Math.max(0, Math.min(...values) * 0.85), Math.max(...values) * 1.1, 5);
  const [lo, hi] = axis.domain;
  const tick = (v: number) => showNumber(v, axis.decimals);
  const t = tolerancePct / 100;
  const line = (k: number): [{ x: number; y: number }, { x: number; y: number }] => [
    { x: lo, y: lo * k },
    { x: hi, y: hi * k },
  ];
  return (
    <ResponsiveContainer width="100%" height="100%">
      <ScatterChart margin={{ top: 10, right: 48, bottom: 30, left: 16 }}>
        <CartesianGrid stroke="#c3c0b6" strokeDasharray="3 3" />
        <XAxis
          dataKey="predicted"
          type="number"
          domain={axis.domain}
          ticks={axis.ticks}
          tickFormatter={tick}
          label={{ value: `predicted, ${unit}`, position: "insideBottom", offset: -18 }}
        />
        <YAxis
          dataKey="measured"
          type="number"
          domain={axis.domain}
          ticks={axis.ticks}
          tickFormatter={tick}
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
                <strong>{p.tag}</strong>: measured {p.measuredText}, predicted {p.predictedText}, {p.verdict}
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
  );
}
