"use client";

import { FormField } from "@/components/ui/form-field";
import {
  createColumnHelper,
  functionalUpdate,
  useTable,
  type ColumnFiltersState,
  type ColumnSort,
  type SortingState,
} from "@tanstack/react-table";
import Link from "next/link";
import { useMemo } from "react";
import {
  compareText,
  isPlainClick,
  readSorting,
  SetupTable,
  setupFeatures,
  sortingParams,
  useUrlView,
} from "@/components/setup/url-table";
import { RefreshError, useRouteData } from "@/components/setup/use-route-data";
import { VerdictBadge } from "@/components/ui/verdict-badge";
import { KIND_LABELS } from "@/lib/schemas/tendon";
import type { TendonListItem } from "@/lib/server/list-tendons";
import {
  showComputedLength,
  showForce,
  showLongLength,
  showPressure,
  type DisplayUnits,
} from "@/lib/format/quantities";
import { formatLength, type ReadingResolution } from "@/lib/units";

export interface TendonList {
  pour: { id: string; name: string };
  tendons: TendonListItem[];
}

/** The route handler that lists a pour's tendons; also the swr key the import and the form refresh. */
export const tendonsKey = (projectId: string, pourId: string) => `/api/projects/${projectId}/pours/${pourId}/tendons`;

export const SORTS = ["tag", "member", "length", "predicted", "ends", "lot", "kind"] as const;
const DEFAULT_SORT: ColumnSort = { id: "tag", desc: false };
const ENDS = ["A", "B", "both"] as const;

/** The filters in the URL: q (part of a tag), ends, lot ("none" for tendons without one). */
function readFilters(params: URLSearchParams): ColumnFiltersState {
  const q = (params.get("q") ?? "").slice(0, 60);
  const ends = ENDS.find((e) => e === params.get("ends"));
  const lot = (params.get("lot") ?? "").slice(0, 60);
  return [
    ...(q ? [{ id: "tag", value: q }] : []),
    ...(ends ? [{ id: "ends", value: ends }] : []),
    ...(lot ? [{ id: "lot", value: lot }] : []),
  ];
}

function filterParams(filters: ColumnFiltersState): Record<"q" | "ends" | "lot", string | null> {
  const value = (id: string) => {
    const v = filters.find((f) => f.id === id)?.value;
    return typeof v === "string" && v ? v : null;
  };
  return { q: value("tag"), ends: value("ends"), lot: value("lot") };
}

const helper = createColumnHelper<typeof setupFeatures, TendonListItem>();

/** The equipment sets the rows give gauge targets for, by name. */
function targetSets(tendons: TendonListItem[]): string[] {
  return [...new Set(tendons.flatMap((t) => t.targets.map((g) => g.set)))].sort(compareText);
}

/**
 * The columns; `gaugeSet` names the one equipment set whose target gauge pressure is shown, or is
 * null for every set's.
 */
function tendonColumns(projectId: string, us: boolean, resolution: ReadingResolution, gaugeSet: string | null) {
  // Only the unit system matters to the computed-length, long-length and pressure formats.
  const units: DisplayUnits = { unitSystem: us ? "us" : "si", readingResolution: us ? "1/8in" : "1mm" };
  const long = (mm: number) => showLongLength(units, mm);
  return helper.columns([
    helper.accessor("tag", {
      header: "Tag",
      sortFn: (a, b, id) => compareText(a.getValue<string>(id), b.getValue<string>(id)),
      filterFn: (row, id, value: string) => row.getValue<string>(id).toLowerCase().includes(value.toLowerCase()),
      cell: (c) => (
        <Link
          href={`/projects/${projectId}/tendons/${c.row.original.id}`}
          className="inline-flex min-h-touch items-center whitespace-nowrap font-semibold"
        >
          {c.getValue()}
        </Link>
      ),
    }),
    // The latest verdict beside the tag: the two columns people look for stay in sight when the rest scrolls.
    helper.display({
      id: "verdict",
      header: "Latest verdict",
      cell: (c) => {
        const latest = c.row.original.latest;
        return latest ? (
          <Link href={`/projects/${projectId}/tendons/${c.row.original.id}/flags`} className="no-underline">
            <VerdictBadge
              verdict={latest.verdict}
              deviationPct={latest.deviationPct}
              provisional={latest.provisional}
            />
            <span className="sr-only"> readings and flags of {c.row.original.tag}</span>
          </Link>
        ) : (
          <span className="text-ink-faint">not stressed</span>
        );
      },
    }),
    helper.accessor("kind", {
      header: "Type",
      sortFn: (a, b, id) => compareText(a.getValue<string>(id), b.getValue<string>(id)),
      enableColumnFilter: false,
      cell: (c) => KIND_LABELS[c.getValue()],
    }),
    helper.accessor("member", {
      header: "Member",
      sortFn: (a, b, id) => compareText(a.getValue<string | null>(id), b.getValue<string | null>(id)),
      enableColumnFilter: false,
      cell: (c) => c.getValue() ?? <span className="text-ink-faint">pour</span>,
    }),
    helper.display({
      id: "strand",
      header: "Strand",
      cell: (c) => `${c.row.original.strandCount} × ${c.row.original.strandSize}`,
    }),
    helper.accessor("ends", {
      header: "Ends",
      sortFn: (a, b, id) => compareText(a.getValue<string>(id), b.getValue<string>(id)),
      filterFn: (row, id, value: string) => row.getValue<string>(id) === value,
    }),
    helper.accessor("lengthMm", {
      id: "length",
      header: "Length",
      meta: { right: true },
      sortFn: (a, b, id) => a.getValue<number>(id) - b.getValue<number>(id),
      enableColumnFilter: false,
      cell: (c) => long(c.getValue()),
    }),
    helper.display({
      id: "segments",
      header: "Segments",
      meta: { right: true },
      cell: (c) => c.row.original.segments.length,
    }),
    helper.accessor("predictedMm", {
      id: "predicted",
      header: "Predicted elongation",
      meta: { right: true },
      sortFn: (a, b, id) => (a.getValue<number | null>(id) ?? -1) - (b.getValue<number | null>(id) ?? -1),
      enableColumnFilter: false,
      cell: (c) => {
        const mm = c.getValue();
        return mm === null ? <span className="text-ink-faint">cannot be computed</span> : showComputedLength(units, mm);
      },
    }),
    helper.display({
      id: "jackingForce",
      header: "Jacking force",
      meta: { right: true },
      cell: (c) =>
        c.row.original.jackingForceN === null ? (
          <span className="text-ink-faint">project&apos;s factor</span>
        ) : (
          <span className="tabular-nums">{showForce(units, c.row.original.jackingForceN)}</span>
        ),
    }),
    helper.display({
      id: "targets",
      header: gaugeSet === null ? "Target gauge" : `Target gauge, ${gaugeSet}`,
      cell: (c) => {
        const targets = c.row.original.targets.filter((t) => gaugeSet === null || t.set === gaugeSet);
        return targets.length === 0 ? (
          <span className="text-ink-faint">
            {gaugeSet === null ? "no calibrated set" : `${gaugeSet} not calibrated`}
          </span>
        ) : (
          // Long set names wrap inside the cell; each pressure stays on one line.
          <ul className="min-w-[10rem]">
            {targets.map((t) => (
              <li key={t.set}>
                {gaugeSet === null && <span className="text-ink-faint">{t.set}: </span>}
                <span className="whitespace-nowrap tabular-nums">
                  {t.pressureMPa === null ? "—" : showPressure(units, t.pressureMPa)}
                </span>
              </li>
            ))}
          </ul>
        );
      },
    }),
    helper.display({
      id: "shop",
      header: "Shop elongation",
      meta: { right: true },
      cell: (c) =>
        c.row.original.shopElongationMm === null ? "—" : formatLength(c.row.original.shopElongationMm, resolution),
    }),
    helper.accessor("strandLot", {
      id: "lot",
      header: "Lot",
      sortFn: (a, b, id) => compareText(a.getValue<string | null>(id), b.getValue<string | null>(id)),
      filterFn: (row, id, value: string) =>
        value === "none" ? !row.getValue<string | null>(id) : row.getValue<string | null>(id) === value,
      cell: (c) => c.getValue() ?? <span className="text-ink-faint">nominal</span>,
    }),
  ]);
}

/**
 * A pour's tendon schedule. The first render has the list the page read on the server; after an
 * import or a new tendon the list is read again through the route handler (swr). Sorting and
 * filtering are done by the table library in the browser, with the view kept in the URL.
 */
export function TendonTable(props: {
  base: string;
  projectId: string;
  pourId: string;
  initial: TendonList;
  lots: string[];
  us: boolean;
  resolution: ReadingResolution;
}) {
  const { data, error } = useRouteData(tendonsKey(props.projectId, props.pourId), props.initial);
  const tendons = data.tendons;
  const { params, hrefWith, go } = useUrlView(props.base);
  const sorting = useMemo(() => readSorting(params, SORTS, DEFAULT_SORT), [params]);
  const columnFilters = useMemo(() => readFilters(params), [params]);
  const sets = useMemo(() => targetSets(tendons), [tendons]);
  // One set's targets when the view names a set the rows know; every set's otherwise.
  const gaugeSet = sets.find((s) => s === params.get("set")) ?? null;
  const columns = useMemo(
    () => tendonColumns(props.projectId, props.us, props.resolution, gaugeSet),
    [props.projectId, props.us, props.resolution, gaugeSet],
  );
  const hrefFor = (next: SortingState) => hrefWith(sortingParams(next, DEFAULT_SORT));

  const table = useTable({
    features: setupFeatures,
    columns,
    data: tendons,
    getRowId: (t) => t.id,
    state: { sorting, columnFilters },
    enableSortingRemoval: false,
    onSortingChange: (updater) => go(hrefFor(functionalUpdate(updater, sorting))),
    onColumnFiltersChange: (updater) => go(hrefWith(filterParams(functionalUpdate(updater, columnFilters)))),
  });
  const shown = table.getRowModel().rows.length;
  const total = tendons.length;
  const current = filterParams(columnFilters);

  return (
    <section aria-labelledby="tendons-heading">
      <h2 id="tendons-heading" className="text-lead font-semibold">
        Tendons ({shown === total ? total : `${shown} of ${total}`})
      </h2>
      <RefreshError error={error} what="tendon list" />
      <form
        // Remounted when the URL changes (Clear, the back button), so the fields show the view.
        key={params.toString()}
        method="get"
        action={props.base}
        className={`mt-3 grid gap-3 md:items-end ${
          sets.length > 1 ? "md:grid-cols-[2fr_1fr_1fr_1fr_auto_auto]" : "md:grid-cols-[2fr_1fr_1fr_auto_auto]"
        }`}
        onSubmit={(e) => {
          e.preventDefault();
          const form = new FormData(e.currentTarget);
          const text = (k: string) => String(form.get(k) ?? "").trim();
          const next = [
            { id: "tag", value: text("q").slice(0, 60) },
            { id: "ends", value: text("ends") },
            { id: "lot", value: text("lot").slice(0, 60) },
          ].filter((f) => f.value);
          go(hrefWith({ ...filterParams(next), set: text("set").slice(0, 120) || null }));
        }}
      >
        <FormField id="f-q" name="q" label="Show tags containing" defaultValue={current.q ?? ""} />
        <FormField as="select" id="f-ends" name="ends" label="Show stressing end" defaultValue={current.ends ?? ""}>
          <option value="">Any</option>
          <option value="A">A</option>
          <option value="B">B</option>
          <option value="both">Both</option>
        </FormField>
        <FormField as="select" id="f-lot" name="lot" label="Show strand lot" defaultValue={current.lot ?? ""}>
          <option value="">Any</option>
          <option value="none">No lot</option>
          {props.lots.map((l) => (
            <option key={l}>{l}</option>
          ))}
        </FormField>
        {sets.length > 1 && (
          <FormField as="select" id="f-set" name="set" label="Show gauge targets for" defaultValue={gaugeSet ?? ""}>
            <option value="">Every set</option>
            {sets.map((s) => (
              <option key={s}>{s}</option>
            ))}
          </FormField>
        )}
        {/* Without the script the form is an ordinary GET of the same view. */}
        {params.get("sort") && <input type="hidden" name="sort" value={params.get("sort") ?? ""} />}
        {params.get("dir") && <input type="hidden" name="dir" value={params.get("dir") ?? ""} />}
        <button className="btn-primary" type="submit">
          Filter
        </button>
        <a
          className="btn-quiet"
          href={props.base}
          onClick={(e) => {
            if (!isPlainClick(e)) return;
            e.preventDefault();
            go(props.base);
          }}
        >
          Clear
        </a>
      </form>
      {total === 0 ? (
        <p className="card mt-4">
          This pour has no tendons yet. Import a schedule file or add tendons one by one below.
        </p>
      ) : shown === 0 ? (
        <p className="card mt-4">No tendon matches the filter.</p>
      ) : (
        <div className="mt-4 overflow-x-auto" tabIndex={0} role="region" aria-label="Tendon schedule, scrolls sideways">
          <SetupTable table={table} hrefFor={hrefFor} />
        </div>
      )}
    </section>
  );
}
