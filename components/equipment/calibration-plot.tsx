"use client";

import { CartesianGrid, ComposedChart, Line, ResponsiveContainer, Scatter, XAxis, YAxis } from "recharts";

/** The calibration chart's drawing (recharts), loaded only where the chart is shown. */
export function CalibrationPlot(props: {
  points: { p: number; f: number }[];
  line: { p: number; f: number }[];
  pressureUnit: string;
  forceUnit: string;
}) {
  return (
    <ResponsiveContainer width="100%" height="100%">
      <ComposedChart margin={{ top: 8, right: 12, bottom: 18, left: 4 }}>
        <CartesianGrid stroke="#c3c0b6" strokeDasharray="3 3" />
        <XAxis
          dataKey="p"
          type="number"
          domain={[0, "dataMax"]}
          tickFormatter={(v: number) => v.toFixed(0)}
          label={{ value: props.pressureUnit, position: "insideBottom", offset: -8 }}
        />
        <YAxis
          dataKey="f"
          type="number"
          domain={[0, "auto"]}
          allowDataOverflow
          tickFormatter={(v: number) => v.toFixed(0)}
          label={{ value: props.forceUnit, angle: -90, position: "insideLeft" }}
        />
        <Line data={props.line} dataKey="f" stroke="#14213d" strokeWidth={2} dot={false} isAnimationActive={false} />
        <Scatter data={props.points} dataKey="f" fill="#8a4b00" isAnimationActive={false} />
      </ComposedChart>
    </ResponsiveContainer>
  );
}
