"use client";

import dynamic from "next/dynamic";
import { PlotLoading } from "@/components/ui/plot-loading";
import type { DeviationPoint } from "./verdict-marks";

const DeviationPlot = dynamic(() => import("./deviation-plot").then((m) => m.DeviationPlot), {
  ssr: false,
  loading: PlotLoading,
});

/**
 * Deviation of each tendon against the band: tendon on x (in schedule order), deviation % on y,
 * the band's edges as lines, and each verdict with its own shape and its own colour. The figure,
 * its text alternative and its caption come with the page; the drawing (recharts) loads after it.
 */
export function DeviationChart({ points, tolerancePct }: { points: DeviationPoint[]; tolerancePct: number }) {
  return (
    <figure>
      <div
        className="h-80 w-full"
        role="img"
        aria-label={`Deviation of ${points.length} tendons from their predicted elongation, against the ±${tolerancePct} % band`}
        data-chart="deviation"
      >
        <DeviationPlot points={points} tolerancePct={tolerancePct} />
      </div>
      <figcaption className="mt-1 text-label text-ink-faint">
        Dashed lines: the ±{tolerancePct} % band. Circle: in band; triangle: long; square: short. Hover a mark for its
        tendon.
      </figcaption>
    </figure>
  );
}
