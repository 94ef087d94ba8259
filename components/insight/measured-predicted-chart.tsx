"use client";

import dynamic from "next/dynamic";
import { PlotLoading } from "@/components/ui/plot-loading";
import type { MeasuredPredictedData } from "./verdict-marks";

const MeasuredPredictedPlot = dynamic(() => import("./measured-predicted-plot").then((m) => m.MeasuredPredictedPlot), {
  ssr: false,
  loading: PlotLoading,
});

/**
 * Measured against predicted elongation, in display units, with the 1:1 line and the band. The figure,
 * its text alternative and its caption come with the page; the drawing (recharts) loads after it.
 */
export function MeasuredPredictedChart({ points, tolerancePct, unit }: MeasuredPredictedData) {
  return (
    <figure>
      <div
        className="h-80 w-full"
        role="img"
        aria-label={`Measured against predicted elongation in ${unit}, with the equal line and the ±${tolerancePct} % band`}
        data-chart="measured-predicted"
      >
        <MeasuredPredictedPlot points={points} tolerancePct={tolerancePct} unit={unit} />
      </div>
      <figcaption className="mt-1 text-label text-ink-faint">
        Solid line: measured equals predicted. Dashed: the ±{tolerancePct} % band.
      </figcaption>
    </figure>
  );
}
