"use client";

import {
  CartesianGrid,
  Legend,
  Line,
  LineChart,
  ReferenceArea,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";

/**
 * Force along the tendon at jacking and after seating, with the anchor-set zones shaded.
 * Values arrive already in display units (x in ft or m, force in kip or kN).
 */
export function ForceProfileChart(props: {
  points: { x: number; jacking: number; seated: number }[];
  zones: { from: number; to: number }[];
  xUnit: string;
  forceUnit: string;
}) {
  return (
    <figure>
      <div
        className="h-72 w-full"
        role="img"
        aria-label={`Force along the tendon in ${props.forceUnit}, at jacking and after seating, over the length in ${props.xUnit}`}
      >
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={props.points} margin={{ top: 10, right: 20, bottom: 20, left: 10 }}>
            <CartesianGrid stroke="#c3c0b6" strokeDasharray="3 3" />
            {props.zones.map((z) => (
              <ReferenceArea
                key={`${z.from}-${z.to}`}
                x1={z.from}
                x2={z.to}
                fill="#dcdad3"
                fillOpacity={0.8}
                label={{ value: "anchor-set zone", position: "insideTop", fill: "#14213d", fontSize: 14 }}
              />
            ))}
            <XAxis
              dataKey="x"
              type="number"
              domain={[0, "dataMax"]}
              tickFormatter={(v: number) => v.toFixed(0)}
              label={{ value: `distance from end A, ${props.xUnit}`, position: "insideBottom", offset: -10 }}
            />
            <YAxis
              domain={["auto", "auto"]}
              tickFormatter={(v: number) => v.toFixed(1)}
              label={{ value: props.forceUnit, angle: -90, position: "insideLeft" }}
            />
            <Tooltip
              formatter={(v) => `${Number(v).toFixed(2)} ${props.forceUnit}`}
              labelFormatter={(v) => `${Number(v).toFixed(1)} ${props.xUnit} from end A`}
            />
            <Legend verticalAlign="top" />
            <Line
              type="linear"
              dataKey="jacking"
              name="at jacking"
              stroke="#14213d"
              strokeWidth={3}
              dot={false}
              isAnimationActive={false}
            />
            <Line
              type="linear"
              dataKey="seated"
              name="after seating"
              stroke="#8a4b00"
              strokeWidth={3}
              strokeDasharray="8 4"
              dot={false}
              isAnimationActive={false}
            />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-label text-ink-faint">
        Solid: force at jacking. Dashed: after the wedges seat. Shaded: where the anchor set reaches.
      </figcaption>
    </figure>
  );
}
