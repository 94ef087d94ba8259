"use client";

import type { ReactNode } from "react";
import { CartesianGrid, Legend, ResponsiveContainer, Scatter, ScatterChart, Tooltip } from "recharts";
import { VERDICT_MARKS } from "./verdict-marks";

/**
 * The frame the insight charts' tendons are drawn in (recharts): the grid, the axes and lines the
 * chart gives as children, a tip for the tendon pointed at, the legend, and one series a verdict,
 * each with its own mark.
 */
export function VerdictScatter<P extends { verdict: keyof typeof VERDICT_MARKS }>(props: {
  points: P[];
  /** What the tip says of the tendon pointed at. */
  tip: (point: P) => ReactNode;
  /** The tooltip's cursor, where the chart wants other than recharts' own. */
  cursor?: { strokeDasharray: string };
  children: ReactNode;
}) {
  return (
    <ResponsiveContainer width="100%" height="100%">
      <ScatterChart margin={{ top: 10, right: 48, bottom: 30, left: 16 }}>
        <CartesianGrid stroke="#c3c0b6" strokeDasharray="3 3" />
        {props.children}
        <Tooltip
          {...(props.cursor ? { cursor: props.cursor } : {})}
          content={({ payload }) => {
            const p = payload?.[0]?.payload as P | undefined;
            if (!p) return null;
            return <div className="rounded-md border-2 border-ink bg-white p-2 text-label">{props.tip(p)}</div>;
          }}
        />
        <Legend verticalAlign="top" />
        {(Object.keys(VERDICT_MARKS) as (keyof typeof VERDICT_MARKS)[]).map((v) => (
          <Scatter
            key={v}
            name={VERDICT_MARKS[v].name}
            data={props.points.filter((p) => p.verdict === v)}
            fill={VERDICT_MARKS[v].colour}
            shape={VERDICT_MARKS[v].shape}
            isAnimationActive={false}
          />
        ))}
      </ScatterChart>
    </ResponsiveContainer>
  );
}
