"use client";

import { ReferenceLine, XAxis, YAxis } from "recharts";
import { niceAxis } from "@/lib/format/axis";
import { showNumber, showPct } from "@/lib/format/quantities";
import type { DeviationPoint } from "./verdict-marks";
import { VerdictScatter } from "./verdict-scatter";

/** The deviation chart's drawing (recharts), loaded only where the chart is shown. */
export function DeviationPlot({ points, tolerancePct }: { points: DeviationPoint[]; tolerancePct: number }) {
  const extent = Math.max(tolerancePct * 1.6, ...points.map((p) => Math.abs(p.deviationPct) + 1));
  // Symmetric about zero, on round percentages.
  const axis = niceAxis(-extent, extent, 6);
  const tagAt = (i: number) => points.find((p) => p.index === i)?.tag ?? "";
  return (
    <VerdictScatter
      points={points}
      cursor={{ strokeDasharray: "3 3" }}
      tip={(p) => (
        <>
          <strong>{p.tag}</strong>: {showPct(p.deviationPct)}, {p.verdict}
          {p.provisional ? " (provisional)" : ""}
        </>
      )}
    >
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
    </VerdictScatter>
  );
}
