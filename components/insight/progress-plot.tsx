"use client";

import { Bar, BarChart, CartesianGrid, Cell, LabelList, ResponsiveContainer, XAxis, YAxis } from "recharts";

/** The pour's counts the progress chart draws, out of the tendons on the schedule. */
export interface PourProgress {
  tendons: number;
  stressed: number;
  flagged: number;
  released: number;
}

/** The progress chart's drawing (recharts), loaded only where the chart is shown. */
export function ProgressPlot({ tendons, stressed, flagged, released }: PourProgress) {
  const data = [
    { label: "Stressed", value: stressed, fill: "#14213d" },
    { label: "With open flags", value: flagged, fill: "#a3181b" },
    { label: "Released", value: released, fill: "#1d6b3a" },
  ];
  return (
    <ResponsiveContainer width="100%" height="100%">
      <BarChart data={data} layout="vertical" margin={{ top: 4, right: 48, bottom: 4, left: 24 }}>
        <CartesianGrid stroke="#c3c0b6" strokeDasharray="3 3" horizontal={false} />
        <XAxis type="number" domain={[0, Math.max(1, tendons)]} allowDecimals={false} />
        <YAxis type="category" dataKey="label" width={130} />
        <Bar dataKey="value" isAnimationActive={false}>
          {data.map((d) => (
            <Cell key={d.label} fill={d.fill} />
          ))}
          <LabelList dataKey="value" position="right" fill="#14213d" />
        </Bar>
      </BarChart>
    </ResponsiveContainer>
  );
}
