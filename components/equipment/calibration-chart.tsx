"use client";

import dynamic from "next/dynamic";
import { PlotLoading } from "@/components/ui/plot-loading";

const CalibrationPlot = dynamic(() => import("./calibration-plot").then((m) => m.CalibrationPlot), {
  ssr: false,
  loading: PlotLoading,
});

/**
 * The certificate's points and the fitted line, in display units. The box and its text alternative
 * come with the page; the drawing (recharts) loads after it.
 */
export function CalibrationChart(props: {
  points: { p: number; f: number }[];
  line: { p: number; f: number }[];
  pressureUnit: string;
  forceUnit: string;
  label: string;
}) {
  return (
    <div className="h-48 w-full" role="img" aria-label={props.label}>
      <CalibrationPlot
        points={props.points}
        line={props.line}
        pressureUnit={props.pressureUnit}
        forceUnit={props.forceUnit}
      />
    </div>
  );
}
