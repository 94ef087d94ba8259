"use client";

import Link from "next/link";
import { createColumnHelper, functionalUpdate, useTable, type SortingState } from "@tanstack/react-table";
import { useCallback, useMemo } from "react";
import type { StrandLotView } from "@/lib/server/list-strand-lots";
import { compareText, readSorting, SetupTable, setupFeatures, sortingParams, useUrlView } from "./url-table";
import { RefreshError, useRouteData } from "./use-route-data";
import { showPct } from "@/lib/format/quantities";
import { mm2ToIn2, mpaToKsi, nToKip, nToKN } from "@/lib/units";

/** The route handler that lists the project's strand lots; also the swr key the lot form refreshes. */
export const strandLotsKey = (projectId: string) => `/api/projects/${projectId}/strand-lots`;

const SORTS = ["lot", "size", "area", "modulus", "breaking", "ae", "tendons"] as const;
const byNumber = (a: number | null | undefined, b: number | null | undefined) =>
  (a ?? -Infinity) - (b ?? -Infinity) || 0;
const helper = createColumnHelper<typeof setupFeatures, StrandLotView>();

function Against({ pct }: { pct: number | undefined }) {
  return pct === undefined ? null : <span className="block text-label text-ink-soft">{showPct(pct)}</span>;
}

function lotColumns(projectId: string, us: boolean, editHref: (lotId: string) => string) {
  return helper.columns([
    helper.accessor("lotNumber", {
      id: "lot",
      header: "Lot",
      sortFn: (a, b, id) => compareText(a.getValue<string>(id), b.getValue<string>(id)),
      cell: (c) => <span className="font-semibold">{c.getValue()}</span>,
    }),
    helper.accessor("strandSize", {
      id: "size",
      header: "Size",
      sortFn: (a, b, id) => compareText(a.getValue<string>(id), b.getValue<string>(id)),
    }),
    helper.accessor("areaMm2", {
      id: "area",
      header: "Area",
      meta: { right: true },
      sortFn: (a, b, id) => a.getValue<number>(id) - b.getValue<number>(id),
      cell: (c) => (
        <>
          {us ? `${mm2ToIn2(c.getValue()).toFixed(4)} in²` : `${c.getValue().toFixed(1)} mm²`}
          <Against pct={c.row.original.againstNominal?.areaPct} />
        </>
      ),
    }),
    helper.accessor("modulusMPa", {
      id: "modulus",
      header: "Modulus",
      meta: { right: true },
      sortFn: (a, b, id) => a.getValue<number>(id) - b.getValue<number>(id),
      cell: (c) => (
        <>
          {us ? `${mpaToKsi(c.getValue()).toFixed(0)} ksi` : `${(c.getValue() / 1000).toFixed(1)} GPa`}
          <Against pct={c.row.original.againstNominal?.modulusPct} />
        </>
      ),
    }),
    helper.accessor("breakingLoadN", {
      id: "breaking",
      header: "Breaking load",
      meta: { right: true },
      sortFn: (a, b, id) => a.getValue<number>(id) - b.getValue<number>(id),
      cell: (c) => (
        <>
          {us ? `${nToKip(c.getValue()).toFixed(1)} kip` : `${nToKN(c.getValue()).toFixed(1)} kN`}
          <Against pct={c.row.original.againstNominal?.breakingPct} />
        </>
      ),
    }),
    helper.accessor((l) => l.againstNominal?.areaTimesModulusPct ?? null, {
      id: "ae",
      header: "A·E against nominal",
      meta: { right: true },
      sortFn: (a, b, id) => byNumber(a.getValue<number | null>(id), b.getValue<number | null>(id)),
      cell: (c) => {
        const pct = c.getValue();
        return <span className="font-semibold">{pct === null ? "—" : showPct(pct)}</span>;
      },
    }),
    helper.accessor("tendonCount", {
      id: "tendons",
      header: "Tendons",
      meta: { right: true },
      sortFn: (a, b, id) => a.getValue<number>(id) - b.getValue<number>(id),
    }),
    helper.display({
      id: "certificate",
      header: "Certificate",
      cell: (c) => {
        const l = c.row.original;
        return l.certificateAttachmentId ? (
          <a
            href={`/api/projects/${projectId}/attachments/${l.certificateAttachmentId}`}
            className="inline-flex min-h-touch items-center"
          >
            {l.certificateName ?? "certificate"}
          </a>
        ) : (
          <strong>
            <span aria-hidden="true">⚠ </span>none on file
          </strong>
        );
      },
    }),
    helper.display({
      id: "edit",
      header: () => <span className="sr-only">Edit</span>,
      cell: (c) => (
        <Link
          href={editHref(c.row.original.id)}
          className="inline-flex min-h-touch items-center"
          aria-label={`Edit lot ${c.row.original.lotNumber}`}
        >
          Edit
        </Link>
      ),
    }),
  ]);
}

/** The project's strand lots with the change against nominal values; sortable, the sort kept in the URL. */
export function StrandLotTable(props: { projectId: string; us: boolean; initial: { strandLots: StrandLotView[] } }) {
  const { data, error } = useRouteData(strandLotsKey(props.projectId), props.initial);
  const { params, hrefWith, go } = useUrlView(`/projects/${props.projectId}/strand-lots`);
  const sorting = useMemo(() => readSorting(params, SORTS, null), [params]);
  const editHref = useCallback((lotId: string) => `${hrefWith({ edit: lotId })}#edit-lot`, [hrefWith]);
  const columns = useMemo(() => lotColumns(props.projectId, props.us, editHref), [props.projectId, props.us, editHref]);
  const hrefFor = (next: SortingState) => hrefWith(sortingParams(next, null));
  const table = useTable({
    features: setupFeatures,
    columns,
    data: data.strandLots,
    getRowId: (l) => l.id,
    state: { sorting },
    enableSortingRemoval: false,
    enableColumnFilters: false,
    onSortingChange: (updater) => go(hrefFor(functionalUpdate(updater, sorting))),
  });
  return (
    <>
      <RefreshError error={error} what="list of strand lots" />
      {data.strandLots.length === 0 ? (
        <p className="card mt-6">No strand lots yet. Register each reel or pack with its mill certificate below.</p>
      ) : (
        <div className="mt-6 overflow-x-auto" tabIndex={0} role="region" aria-label="Strand lots, scrolls sideways">
          <SetupTable table={table} hrefFor={hrefFor} />
        </div>
      )}
    </>
  );
}
