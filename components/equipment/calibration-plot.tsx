"use client";

import { CartesianGrid, ComposedChart, Line, ResponsiveContainer, Scatter, XAxis, YAxis } from "recharts";
import { niceAxis } from "@/lib/format/axis";
import { showNumber } from "@/lib/format/quantities";

/** The calibration chart's drawing (recharts), loaded only where the chart is shown. */
export function CalibrationPlot(props: {
  points: { p: number; f: number }[];
  line: { p: number; f: number }[];
  pressureUnit: string;
  forceUnit: string;
}) {
  // From zero, on round values of the units shown.
  const all = [...props.points, ...props.line];
  const px = niceAxis(0, Math.max(...all.map((d) => d.p)), 5);
  const fy = niceAxis(0, Math.max(...all.map((d) => d.f)), 5);
  return (
    <ResponsiveContainer width="100%" height="100%">
      <ComposedChart margin={{ top: 8, right: 12, bottom: 18, left: 4 }}>
        <CartesianGrid stroke="#c3c0b6" strokeDasharray="3 3" />
        <XAxis
          dataKey="p"
          type="number"
          domain={px.domain}
          ticks={px.ticks}
          tickFormatter={(v: number) => showNumber(v, px.decimals)}
          label={{ value: props.pressureUnit, position: "insideBottom", offset: -8 }}
        />
        <YAxis
          dataKey="f"
          type="number"
          domain={fy.domain}
          ticks={fy.ticks}
          allowDataOverflow
          tickFormatter={(v: number) => showNumber(v, fy.decimals)}
          label={{ value: props.forceUnit, angle: -90, position: "insideLeft" }}
        />
        <Line data={props.line} dataKey="f" stroke="#14213d" strokeWidth={2} dot={false} isAnimationActive={false} />
        <Scatter data={props.points} dataKey="f" fill="#8a4b00" isAnimationActive={false} />
      </ComposedChart>
    </ResponsiveContainer>
  );
}
