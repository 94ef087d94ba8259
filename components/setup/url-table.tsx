"use client";

import {
  columnFilteringFeature,
  createFilteredRowModel,
  createSortedRowModel,
  FlexRender,
  metaHelper,
  rowSortingFeature,
  tableFeatures,
  type ColumnSort,
  type ReactTable,
  type RowData,
  type SortingState,
} from "@tanstack/react-table";
import { useSearchParams } from "next/navigation";
import { useCallback } from "react";

export interface SetupColumnMeta {
  /** Figures are right-aligned. */
  right?: boolean;
}

/** What the setup tables use of the table library: column sorting and column filtering, in the browser. */
export const setupFeatures = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  columnFilteringFeature,
  filteredRowModel: createFilteredRowModel(),
  columnMeta: metaHelper<SetupColumnMeta>(),
});
export type SetupFeatures = typeof setupFeatures;

const collator = new Intl.Collator("en", { numeric: true, sensitivity: "base" });
/** Text in the order a person expects ("T2" before "T10"); an empty value first. */
export const compareText = (a: string | null | undefined, b: string | null | undefined) =>
  collator.compare(a ?? "", b ?? "");

/**
 * The view of a setup table (sort and filters) lives in the URL's search params, so a link
 * reproduces it. The table library sorts and filters in the browser; these helpers read that
 * state from the URL and write it back with history.pushState, which Next.js follows without a
 * round trip to the server.
 */
export function useUrlView(base: string) {
  const params = useSearchParams();
  const hrefWith = useCallback(
    (change: Record<string, string | null>) => {
      const next = new URLSearchParams(params.toString());
      for (const [k, v] of Object.entries(change)) {
        if (v) next.set(k, v);
        else next.delete(k);
      }
      const s = next.toString();
      return s ? `${base}?${s}` : base;
    },
    [base, params],
  );
  const go = useCallback((href: string) => window.history.pushState(null, "", href), []);
  return { params, hrefWith, go };
}

/** `sort` and `dir` from the URL; an unknown column falls back to the table's default order. */
export function readSorting(
  params: URLSearchParams,
  allowed: readonly string[],
  fallback: ColumnSort | null,
): SortingState {
  const id = params.get("sort");
  if (id && allowed.includes(id)) return [{ id, desc: params.get("dir") === "desc" }];
  if (fallback) return [{ id: fallback.id, desc: params.get("dir") === "desc" }];
  return [];
}

/** The search params for a sorting state: the default column and ascending order are left out. */
export function sortingParams(
  sorting: SortingState,
  fallback: ColumnSort | null,
): { sort: string | null; dir: string | null } {
  const first = sorting[0];
  if (!first) return { sort: null, dir: null };
  return { sort: fallback && first.id === fallback.id ? null : first.id, dir: first.desc ? "desc" : null };
}

/** An ordinary click (no modifier key, main button) is handled in place; others open the link as usual. */
export function isPlainClick(e: React.MouseEvent): boolean {
  return e.button === 0 && !e.metaKey && !e.ctrlKey && !e.shiftKey && !e.altKey;
}

/**
 * A column header that sorts: a link to the sorted view (so it works before the script loads and
 * can be opened in a new tab), marked with aria-sort, with a touch-sized hit area.
 */
export function SortHeader(props: {
  label: React.ReactNode;
  sorted: false | "asc" | "desc";
  href: string;
  onSort: () => void;
  right?: boolean;
  className?: string;
}) {
  const { sorted } = props;
  return (
    <th
      className={`${props.className ?? "p-2"} ${props.right ? "text-right" : ""}`}
      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
    >
      <a
        href={props.href}
        className="inline-flex min-h-touch items-center gap-1"
        onClick={(e) => {
          if (!isPlainClick(e)) return;
          e.preventDefault();
          props.onSort();
        }}
      >
        {props.label}
        <span aria-hidden="true">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
      </a>
    </th>
  );
}

/**
 * One setup table: headers from the table library (sortable ones as SortHeader links whose
 * target is the sorted view), rows from its filtered and sorted row model.
 */
export function SetupTable<TData extends RowData>(props: {
  table: ReactTable<SetupFeatures, TData>;
  hrefFor: (sorting: SortingState) => string;
  cellClass?: string;
  caption?: string;
}) {
  const { table } = props;
  const pad = props.cellClass ?? "p-2";
  return (
    <table className="w-full border-collapse text-left">
      {props.caption && <caption className="sr-only">{props.caption}</caption>}
      <thead>
        {table.getHeaderGroups().map((group) => (
          <tr key={group.id} className="border-b-2 border-ink">
            {group.headers.map((header) => {
              const column = header.column;
              const right = column.columnDef.meta?.right ?? false;
              if (header.isPlaceholder || !column.getCanSort()) {
                return (
                  <th key={header.id} className={`${pad} ${right ? "text-right" : ""}`}>
                    {header.isPlaceholder ? null : <FlexRender header={header} />}
                  </th>
                );
              }
              const sorted = column.getIsSorted();
              // Ascending first; a second press on the sorted column turns it round.
              const desc = sorted === "asc";
              return (
                <SortHeader
                  key={header.id}
                  className={pad}
                  right={right}
                  sorted={sorted}
                  href={props.hrefFor([{ id: column.id, desc }])}
                  onSort={() => column.toggleSorting(desc, false)}
                  label={<FlexRender header={header} />}
                />
              );
            })}
          </tr>
        ))}
      </thead>
      <tbody>
        {table.getRowModel().rows.map((row) => (
          <tr key={row.id} className="border-b border-concrete-300">
            {row.getAllCells().map((cell) => (
              <td key={cell.id} className={`${pad} ${cell.column.columnDef.meta?.right ? "text-right" : ""}`}>
                <FlexRender cell={cell} />
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
