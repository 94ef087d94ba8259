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
import { showNumber, showPct } from "@/lib/format/quantities";
import { VERDICT_MARKS, type DeviationPoint } from "./verdict-marks";

/** The deviation chart's drawing (recharts), loaded only where the chart is shown. */
export function DeviationPlot({ points, tolerancePct }: { points: DeviationPoint[]; tolerancePct: number }) {
  const extent = Math.max(tolerancePct * 1.6, ...points.map((p) => Math.abs(p.deviationPct) + 1));
  // Symmetric about zero, on round percentages.
  const axis = niceAxis(-extent, extent, 6);
  const tagAt = (i: number) => points.find((p) => p.index === i)?.tag ?? "";
  return (
    <ResponsiveContainer width="100%" height="100%">
      <ScatterChart margin={{ top: 10, right: 48, bottom: 30, left: 16 }}>
        <CartesianGrid stroke="#c3c0b6" strokeDasharray="3 3" />
        <XAxis
          dataKey="index"
          type="number"
          domain={[0, points.length + 1]}
          allowDecimals={false}
          tickFormatter={(v: number) => tagAt(v)}
          label={{ value: "tendon, in schedule order", position: "insideBottom", offset: -18 }}
        />
        <YAxis
          dataKey="deviationPct"
          type="number"
          domain={axis.domain}
          ticks={axis.ticks}
          tickFormatter={(v: number) => `${v > 0 ? "+" : v < 0 ? "−" : ""}${showNumber(Math.abs(v), axis.decimals)} %`}
          label={{ value: "deviation, %", angle: -90, position: "left", offset: 0 }}
        />
        <ReferenceLine
          y={tolerancePct}
          stroke="#14213d"
          strokeWidth={2}
          strokeDasharray="6 4"
          label={{ value: `+${tolerancePct} %`, position: "right", fill: "#14213d" }}
        />
        <ReferenceLine y={0} stroke="#77746a" />
        <ReferenceLine
          y={-tolerancePct}
          stroke="#14213d"
          strokeWidth={2}
          strokeDasharray="6 4"
          label={{ value: `−${tolerancePct} %`, position: "right", fill: "#14213d" }}
        />
        <Tooltip
          cursor={{ strokeDasharray: "3 3" }}
          formatter={(value, name) => (name === "deviation" ? showPct(Number(value)) : String(value))}
          labelFormatter={() => ""}
          content={({ payload }) => {
            const p = payload?.[0]?.payload as DeviationPoint | undefined;
            if (!p) return null;
            return (
              <div className="rounded-md border-2 border-ink bg-white p-2 text-label">
                <strong>{p.tag}</strong>: {showPct(p.deviationPct)}, {p.verdict}
                {p.provisional ? " (provisional)" : ""}
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
