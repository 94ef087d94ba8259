"use client";

import dynamic from "next/dynamic";
import { PlotLoading } from "@/components/ui/plot-loading";

const ProgressPlot = dynamic(() => import("./progress-plot").then((m) => m.ProgressPlot), {
  ssr: false,
  loading: PlotLoading,
});

/**
 * The pour's progress: tendons stressed, with open flags, and released, out of the schedule. The
 * figure and its text alternative come with the page; the drawing (recharts) loads after it.
 */
export function ProgressChart({
  tendons,
  stressed,
  flagged,
  released,
}: {
  tendons: number;
  stressed: number;
  flagged: number;
  released: number;
}) {
  return (
    <figure>
      <div
        className="h-48 w-full"
        role="img"
        aria-label={`${stressed} of ${tendons} tendons stressed, ${flagged} with open flags, ${released} released`}
        data-chart="progress"
      >
        <ProgressPlot tendons={tendons} stressed={stressed} flagged={flagged} released={released} />
      </div>
      <figcaption className="mt-1 text-label text-ink-faint">Out of {tendons} tendons on the schedule.</figcaption>
    </figure>
  );
}
