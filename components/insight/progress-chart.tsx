"use client";

import dynamic from "next/dynamic";
import { PlotLoading } from "@/components/ui/plot-loading";
import type { PourProgress } from "./progress-plot";

const ProgressPlot = dynamic(() => import("./progress-plot").then((m) => m.ProgressPlot), {
  ssr: false,
  loading: PlotLoading,
});

/**
 * The pour's progress: tendons stressed, with open flags, and released, out of the schedule. The
 * figure and its text alternative come with the page; the drawing (recharts) loads after it.
 */
export function ProgressChart(progress: PourProgress) {
  const { tendons, stressed, flagged, released } = progress;
  return (
    <figure>
      <div
        className="h-48 w-full"
        role="img"
        aria-label={`${stressed} of ${tendons} tendons stressed, ${flagged} with open flags, ${released} released`}
        data-chart="progress"
      >
        <ProgressPlot {...progress} />
      </div>
      <figcaption className="mt-1 text-label text-ink-faint">Out of {tendons} tendons on the schedule.</figcaption>
    </figure>
  );
}
