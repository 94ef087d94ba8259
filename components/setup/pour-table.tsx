"use client";

import { createColumnHelper, functionalUpdate, useTable, type SortingState } from "@tanstack/react-table";
import Link from "next/link";
import { useMemo } from "react";
import { showPlanArea } from "@/lib/format/quantities";
import type { PourSummary } from "@/lib/server/list-pours";
import { compareText, readSorting, SetupTable, setupFeatures, sortingParams, useUrlView } from "./url-table";
import { RefreshError, useRouteData } from "./use-route-data";

/** The route handler that lists the project's pours; also the swr key the pour form refreshes. */
export const poursKey = (projectId: string) => `/api/projects/${projectId}/pours`;

const SORTS = ["name", "level", "area", "planned", "status", "tendons"] as const;
const helper = createColumnHelper<typeof setupFeatures, PourSummary>();
const byNumber = (a: number | null, b: number | null) => (a ?? -Infinity) - (b ?? -Infinity) || 0;

function pourColumns(projectId: string, us: boolean) {
  return helper.columns([
    helper.accessor("name", {
      header: "Pour",
      sortFn: (a, b, id) => compareText(a.getValue<string>(id), b.getValue<string>(id)),
      cell: (c) => (
        <Link
          href={`/projects/${projectId}/pours/${c.row.original.id}`}
          className="inline-flex min-h-touch items-center font-semibold"
        >
          {c.getValue()}
        </Link>
      ),
    }),
    helper.accessor("level", {
      header: "Level",
      sortFn: (a, b, id) => compareText(a.getValue<string | null>(id), b.getValue<string | null>(id)),
      cell: (c) => c.getValue() ?? "—",
    }),
    helper.accessor("areaM2", {
      id: "area",
      header: "Area",
      meta: { right: true },
      sortFn: (a, b, id) => byNumber(a.getValue<number | null>(id), b.getValue<number | null>(id)),
      cell: (c) => {
        const m2 = c.getValue();
        return m2 === null ? "—" : showPlanArea({ unitSystem: us ? "us" : "si" }, m2);
      },
    }),
    helper.accessor("plannedStressingDate", {
      id: "planned",
      header: "Planned stressing",
      sortFn: (a, b, id) => compareText(a.getValue<string | null>(id), b.getValue<string | null>(id)),
      cell: (c) => c.getValue() ?? "—",
    }),
    helper.accessor("status", {
      header: "Status",
      sortFn: (a, b, id) => compareText(a.getValue<string>(id), b.getValue<string>(id)),
    }),
    helper.accessor("tendonCount", {
      id: "tendons",
      header: "Tendons",
      meta: { right: true },
      sortFn: (a, b, id) => a.getValue<number>(id) - b.getValue<number>(id),
      cell: (c) => (c.getValue() === 0 ? <strong>none yet</strong> : c.getValue()),
    }),
  ]);
}

/**
 * The project's pours, in the order the server gives (planned date, then name) until a header
 * is pressed; the sort is kept in the URL. Read again through swr after a pour is added.
 */
export function PourTable(props: { projectId: string; us: boolean; initial: { pours: PourSummary[] } }) {
  const { data, error } = useRouteData(poursKey(props.projectId), props.initial);
  const { params, hrefWith, go } = useUrlView(`/projects/${props.projectId}/pours`);
  const sorting = useMemo(() => readSorting(params, SORTS, null), [params]);
  const columns = useMemo(() => pourColumns(props.projectId, props.us), [props.projectId, props.us]);
  const hrefFor = (next: SortingState) => hrefWith(sortingParams(next, null));
  const table = useTable({
    features: setupFeatures,
    columns,
    data: data.pours,
    getRowId: (p) => p.id,
    state: { sorting },
    enableSortingRemoval: false,
    enableColumnFilters: false,
    onSortingChange: (updater) => go(hrefFor(functionalUpdate(updater, sorting))),
  });
  return (
    <>
      <RefreshError error={error} what="list of pours" />
      {data.pours.length === 0 ? (
        <p className="card mt-6">No pours yet. Add the first one below, then import its tendon schedule.</p>
      ) : (
        <div className="mt-6 overflow-x-auto" tabIndex={0} role="region" aria-label="Pours, scrolls sideways">
          <SetupTable table={table} hrefFor={hrefFor} cellClass="p-3" />
        </div>
      )}
    </>
  );
}
