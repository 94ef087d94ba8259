import Link from "next/link";
import { KIND_LABELS } from "@/lib/schemas/tendon";
import type { TendonRow } from "@/lib/server/list-tendons";

export const SORTS = ["tag", "length", "ends", "lot", "kind"] as const;
export type Sort = (typeof SORTS)[number];

export interface TableQuery {
  q: string;
  ends: "" | "A" | "B" | "both";
  lot: string;
  sort: Sort;
  dir: "asc" | "desc";
}

export function readQuery(sp: Record<string, string | string[] | undefined>): TableQuery {
  const one = (k: string) => (Array.isArray(sp[k]) ? sp[k][0] : sp[k]) ?? "";
  const sort = SORTS.includes(one("sort") as Sort) ? (one("sort") as Sort) : "tag";
  const ends = (["A", "B", "both"] as const).find((e) => e === one("ends")) ?? "";
  return { q: one("q").slice(0, 60), ends, lot: one("lot").slice(0, 60), sort, dir: one("dir") === "desc" ? "desc" : "asc" };
}

const collator = new Intl.Collator("en", { numeric: true, sensitivity: "base" });

/** Filter and sort on the server from the URL, so a filtered view can be shared and reloaded. */
export function applyQuery(rows: TendonRow[], q: TableQuery): TendonRow[] {
  const needle = q.q.toLowerCase();
  const kept = rows.filter((t) => (!needle || t.tag.toLowerCase().includes(needle)) && (!q.ends || t.ends === q.ends) && (!q.lot || (q.lot === "none" ? !t.strandLot : t.strandLot === q.lot)));
  const key = (t: TendonRow): string | number => (q.sort === "length" ? t.lengthMm : q.sort === "ends" ? t.ends : q.sort === "lot" ? (t.strandLot ?? "") : q.sort === "kind" ? t.kind : t.tag);
  const sorted = kept.sort((a, b) => {
    const x = key(a);
    const y = key(b);
    return typeof x === "number" && typeof y === "number" ? x - y : collator.compare(String(x), String(y));
  });
  return q.dir === "desc" ? sorted.reverse() : sorted;
}

function href(base: string, q: TableQuery, change: Partial<TableQuery>): string {
  const next = { ...q, ...change };
  const sp = new URLSearchParams();
  for (const [k, v] of Object.entries(next)) if (v && !(k === "sort" && v === "tag") && !(k === "dir" && v === "asc")) sp.set(k, v);
  const s = sp.toString();
  return s ? `${base}?${s}` : base;
}

export function TendonTable(props: { base: string; projectId: string; rows: TendonRow[]; total: number; query: TableQuery; lots: string[]; formatLong: (mm: number) => string; formatShort: (mm: number) => string }) {
  const { query: q } = props;
  const header = (key: Sort, label: string, right = false) => {
    const active = q.sort === key;
    const dir = active && q.dir === "asc" ? "desc" : "asc";
    return (
      <th className={`p-2 ${right ? "text-right" : ""}`} aria-sort={active ? (q.dir === "asc" ? "ascending" : "descending") : "none"}>
        <Link href={href(props.base, q, { sort: key, dir })} className="inline-flex min-h-touch items-center gap-1">
          {label}
          <span aria-hidden="true">{active ? (q.dir === "asc" ? "▲" : "▼") : "↕"}</span>
        </Link>
      </th>
    );
  };
  return (
    <section aria-labelledby="tendons-heading">
      <h2 id="tendons-heading" className="text-lead font-semibold">
        Tendons ({props.rows.length === props.total ? props.total : `${props.rows.length} of ${props.total}`})
      </h2>
      <form method="get" action={props.base} className="mt-3 grid gap-3 md:grid-cols-[2fr_1fr_1fr_auto_auto] md:items-end">
        <div>
          <label htmlFor="f-q" className="field-label">
            Show tags containing
          </label>
          <input id="f-q" name="q" defaultValue={q.q} className="field-input mt-1" />
        </div>
        <div>
          <label htmlFor="f-ends" className="field-label">
            Show stressing end
          </label>
          <select id="f-ends" name="ends" defaultValue={q.ends} className="field-input mt-1">
            <option value="">Any</option>
            <option value="A">A</option>
            <option value="B">B</option>
            <option value="both">Both</option>
          </select>
        </div>
        <div>
          <label htmlFor="f-lot" className="field-label">
            Show strand lot
          </label>
          <select id="f-lot" name="lot" defaultValue={q.lot} className="field-input mt-1">
            <option value="">Any</option>
            <option value="none">No lot</option>
            {props.lots.map((l) => (
              <option key={l}>{l}</option>
            ))}
          </select>
        </div>
        <input type="hidden" name="sort" value={q.sort} />
        <input type="hidden" name="dir" value={q.dir} />
        <button className="btn-primary" type="submit">
          Filter
        </button>
        <Link className="btn-quiet" href={props.base}>
          Clear
        </Link>
      </form>
      {props.total === 0 ? (
        <p className="card mt-4">This pour has no tendons yet. Import a schedule file or add tendons one by one below.</p>
      ) : props.rows.length === 0 ? (
        <p className="card mt-4">No tendon matches the filter.</p>
      ) : (
        <div className="mt-4 overflow-x-auto">
          <table className="w-full border-collapse text-left">
            <thead>
              <tr className="border-b-2 border-ink">
                {header("tag", "Tag")}
                {header("kind", "Type")}
                <th className="p-2">Strand</th>
                {header("ends", "Ends")}
                {header("length", "Length", true)}
                <th className="p-2 text-right">Segments</th>
                <th className="p-2 text-right">Shop elongation</th>
                {header("lot", "Lot")}
              </tr>
            </thead>
            <tbody>
              {props.rows.map((t) => (
                <tr key={t.id} className="border-b border-concrete-300">
                  <td className="p-2">
                    <Link href={`/projects/${props.projectId}/tendons/${t.id}`} className="inline-flex min-h-touch items-center font-semibold">
                      {t.tag}
                    </Link>
                  </td>
                  <td className="p-2">{KIND_LABELS[t.kind]}</td>
                  <td className="p-2">
                    {t.strandCount} × {t.strandSize}
                  </td>
                  <td className="p-2">{t.ends}</td>
                  <td className="p-2 text-right">{props.formatLong(t.lengthMm)}</td>
                  <td className="p-2 text-right">{t.segments.length}</td>
                  <td className="p-2 text-right">{t.shopElongationMm === null ? "—" : props.formatShort(t.shopElongationMm)}</td>
                  <td className="p-2">{t.strandLot ?? <span className="text-ink-faint">nominal</span>}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
