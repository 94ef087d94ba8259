"use client";

import { ReferenceLine, XAxis, YAxis } from "recharts";
import { niceAxis } from "@/lib/format/axis";
import { showNumber } from "@/lib/format/quantities";
import type { MeasuredPredictedData } from "./verdict-marks";
import { VerdictScatter } from "./verdict-scatter";

/** The measured-against-predicted chart's drawing (recharts), loaded only where the chart is shown. */
export function MeasuredPredictedPlot({ points, tolerancePct, unit }: MeasuredPredictedData) {
  const values = points.flatMap((p) => [p.predicted, p.measured]);
  // Both axes alike, on round values of the unit shown, so the equal line runs corner to corner.
  const axis = niceAxis(Math.max(0, Math.min(...values) * 0.85), Math.max(...values) * 1.1, 5);
  const [lo, hi] = axis.domain;
  // Both axes alike: the same scale, ticks and numbers.
  const scale = {
    type: "number",
    domain: axis.domain,
    ticks: axis.ticks,
    tickFormatter: (v: number) => showNumber(v, axis.decimals),
  } as const;
  const t = tolerancePct / 100;
  const line = (k: number): [{ x: number; y: number }, { x: number; y: number }] => [
    { x: lo, y: lo * k },
    { x: hi, y: hi * k },
  ];
  return (
    <VerdictScatter
      points={points}
      tip={(p) => (
        <>
          <strong>{p.tag}</strong>: measured {p.measuredText}, predicted {p.predictedText}, {p.verdict}
        </>
      )}
    >
      <XAxis
        dataKey="predicted"
        {...scale}
        label={{ value: `predicted, ${unit}`, position: "insideBottom", offset: -18 }}
      />
      <YAxis
        dataKey="measured"
        {...scale}
        label={{ value: `measured, ${unit}`, angle: -90, position: "left", offset: 0 }}
      />
      <ReferenceLine segment={line(1)} stroke="#14213d" strokeWidth={2} ifOverflow="hidden" />
      <ReferenceLine segment={line(1 + t)} stroke="#14213d" strokeDasharray="6 4" ifOverflow="hidden" />
      <ReferenceLine segment={line(1 - t)} stroke="#14213d" strokeDasharray="6 4" ifOverflow="hidden" />
    </VerdictScatter>
  );
}
