/**
 * What a chart's sized box shows while its drawing code (loaded on demand) arrives: the box keeps
 * its height, so nothing below it moves, and the figure's text alternative is already in place.
 */
export function PlotLoading() {
  return (
    <p className="grid h-full place-items-center rounded-md border-2 border-dashed border-concrete-300 text-label text-ink-faint">
      Drawing the chart…
    </p>
  );
}
