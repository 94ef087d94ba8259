import Link from "next/link";
import { FormField } from "@/components/ui/form-field";
import { DailySigning } from "@/components/reports/daily-signing";
import { Caution } from "@/components/ui/caution";
import { VerdictBadge } from "@/components/ui/verdict-badge";
import { db } from "@/db";
import { can } from "@/lib/auth/permissions";
import { dayInZone, formatDateTime, shiftDay } from "@/lib/format/dates";
import {
  DAILY_RECORD_COLUMNS,
  dailyConcreteLines,
  dailyConformance,
  dailyDispositionLines,
  dailyEquipmentLines,
  dailyFlagLines,
  dailyRecordLines,
  dailySummary,
  dailyTailCutLines,
  dailyWitnessLines,
  openExceptionLines,
  witnessGroupViews,
  type DailyRecordColumn,
  type DailyRecordLine,
} from "@/lib/reports/daily-rows";
import { DEFAULT_DAILY_STATEMENT, reportDaySchema } from "@/lib/schemas/daily-report";
import { getProjectTimeZone } from "@/lib/server/get-project-time-zone";
import { listDailyRevisions } from "@/lib/server/list-daily-revisions";
import { pageAccess } from "../page-access";
import { Section } from "@/components/ui/section";

export const metadata = { title: "Daily inspection report" };
export const dynamic = "force-dynamic";

/**
 * The columns the screen shows of each stressing; the PDF and CSV carry every column. The pour heads
 * its group of rows instead of a column, and the time is shown without the day the page is about, so
 * the verdict stays on screen at 1280 and 1440.
 */
const SCREEN_COLUMNS: DailyRecordColumn[] = [
  "Tendon",
  "End",
  "Stressing",
  "Stressed",
  "Operator",
  "Method",
  "Final pressure",
  "Measured",
  "Predicted (Tautline)",
  "Verdict",
];
/** Short figures that read badly when wrapped (a lift-off check's or a detension's "Stressing" wraps). */
const NO_WRAP = new Set<DailyRecordColumn>([
  "Tendon",
  "Stressed",
  "Final pressure",
  "Measured",
  "Predicted (Tautline)",
  "Verdict",
]);

/** The day's rows in runs of one pour, in their order (the rows come pour by pour). */
function pourGroups(lines: DailyRecordLine[], pourColumn: number): { pour: string; lines: DailyRecordLine[] }[] {
  const groups: { pour: string; lines: DailyRecordLine[] }[] = [];
  for (const line of lines) {
    const pour = line.cells[pourColumn] ?? "";
    const last = groups.at(-1);
    if (last?.pour === pour) last.lines.push(line);
    else groups.push({ pour, lines: [line] });
  }
  return groups;
}

/** "2026-12-02 21:31 CST" on the page of 2026-12-02 reads "21:31 CST"; another day's moment keeps its date. */
const timeOnDay = (moment: string, day: string) =>
  moment.startsWith(`${day} `) ? moment.slice(day.length + 1) : moment;

function List({ id, title, items, empty }: { id: string; title: string; items: string[]; empty: string }) {
  return (
    <Section id={id} title={title} className="space-y-2">
      {items.length ? (
        <ul className="list-disc space-y-1 pl-6">
          {items.map((item) => (
            <li key={item}>{item}</li>
          ))}
        </ul>
      ) : (
        <p className="text-ink-soft">{empty}</p>
      )}
    </Section>
  );
}

export default async function DailyReportPage({
  params,
  searchParams,
}: {
  params: Promise<{ projectId: string }>;
  searchParams: Promise<{ day?: string | string[] }>;
}) {
  const { projectId } = await params;
  const access = await pageAccess("report.download", projectId);
  const timeZone = await getProjectTimeZone(db, projectId);
  const today = dayInZone(new Date(), timeZone);
  const asked = (await searchParams).day;
  const typed = typeof asked === "string" && asked !== "" ? asked : today;
  const parsed = reportDaySchema.safeParse(typed);
  const day = parsed.success ? parsed.data : null;
  const view = day ? await listDailyRevisions(db, { projectId, day }) : null;
  const api = day ? `/api/projects/${projectId}/daily-reports/${day}` : "";
  const columnIndex = (c: DailyRecordColumn) => DAILY_RECORD_COLUMNS.indexOf(c);
  const lines = view ? dailyRecordLines(view.report) : [];

  return (
    <main className="space-y-8">
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-label uppercase text-ink-faint">{access.projectName}</p>
          <h1 className="text-figure font-bold">Daily special-inspection report{day ? `: ${day}` : ""}</h1>
          <p className="mt-1 text-ink-soft">
            What was recorded on the project that day, in the project&apos;s time zone ({timeZone}). The inspector
            writes the remarks and signs.
          </p>
        </div>
        {view && (
          <div className="flex flex-wrap gap-2">
            <a className="btn-primary" href={`${api}/pdf`} download>
              Day&apos;s report (PDF)
            </a>
            <a className="btn-quiet" href={`${api}/csv`} download>
              Day as CSV
            </a>
          </div>
        )}
      </header>

      <form method="get" className="flex flex-wrap items-end gap-3" aria-label="Pick the day">
        <FormField
          id="report-day"
          name="day"
          type="date"
          label="Day"
          defaultValue={day ?? typed}
          max={today}
          error={parsed.success ? undefined : (parsed.error.issues[0]?.message ?? "Give the day as YYYY-MM-DD.")}
        />
        <button type="submit" className="btn-primary">
          Show the day
        </button>
        {day && (
          <>
            <Link className="btn-quiet" href={`?day=${shiftDay(day, -1)}`}>
              Day before
            </Link>
            {day < today && (
              <Link className="btn-quiet" href={`?day=${shiftDay(day, 1)}`}>
                Day after
              </Link>
            )}
          </>
        )}
      </form>

      {view && day && (
        <>
          <Caution />
          <Section id="daily-summary-heading" title="Summary" className="space-y-2">
            <p data-testid="daily-summary">{dailySummary(view.report)}</p>
          </Section>

          <Section
            id="daily-records-heading"
            title="Stressing records, lift-off checks and detensions of the day"
            className="space-y-2"
          >
            {lines.length ? (
              <div className="overflow-x-auto">
                <table className="w-full border-collapse text-left tabular-nums">
                  <thead>
                    <tr className="border-b-2 border-ink">
                      {SCREEN_COLUMNS.map((c) => (
                        <th key={c} scope="col" className="px-2 py-2 text-label font-bold uppercase">
                          {c === "Predicted (Tautline)"
                            ? "Predicted"
                            : c === "Final pressure"
                              ? "Gauge"
                              : c === "Verdict"
                                ? "Verdict, deviation"
                                : c === "Stressed"
                                  ? "Time"
                                  : c}
                        </th>
                      ))}
                    </tr>
                  </thead>
                  {pourGroups(lines, columnIndex("Pour")).map(({ pour, lines: group }) => (
                    <tbody key={pour}>
                      <tr className="border-b border-ink">
                        <th scope="rowgroup" colSpan={SCREEN_COLUMNS.length} className="px-2 pb-1 pt-4 text-left">
                          {pour}
                        </th>
                      </tr>
                      {group.map(({ cells: row, record }) => {
                        const evaluation = record?.evaluation;
                        return (
                          <tr key={row.join("|")} className="border-b border-concrete-300">
                            {SCREEN_COLUMNS.map((c) => (
                              <td
                                key={c}
                                className={`px-2 py-2 align-top ${NO_WRAP.has(c) ? "whitespace-nowrap" : ""}`}
                              >
                                {c === "Verdict" && evaluation ? (
                                  <>
                                    <VerdictBadge
                                      verdict={evaluation.verdict}
                                      deviationPct={evaluation.deviationPct}
                                      provisional={evaluation.provisional}
                                    />
                                    {!evaluation.current && (
                                      <span className="block text-label text-ink-soft">
                                        superseded by a later stressing
                                      </span>
                                    )}
                                  </>
                                ) : c === "Stressed" && day ? (
                                  timeOnDay(row[columnIndex(c)] ?? "", day)
                                ) : (
                                  row[columnIndex(c)]
                                )}
                              </td>
                            ))}
                          </tr>
                        );
                      })}
                    </tbody>
                  ))}
                </table>
              </div>
            ) : (
              <p className="text-ink-soft">No stressing, lift-off check or detension was recorded this day.</p>
            )}
          </Section>

          <div className="grid gap-8 xl:grid-cols-2">
            <List
              id="daily-witness-heading"
              title="What was stressed and witnessed (as last signed)"
              items={dailyWitnessLines(view.report).map((w) => `${w.label}: ${w.stressed}; ${w.stated}.`)}
              empty="No tendon was stressed this day."
            />
            <Section
              id="daily-conformance-heading"
              title="Statement of conformance (as last signed)"
              className="space-y-2"
            >
              <Conformance {...dailyConformance(view.report)} />
            </Section>
            {(
              [
                [
                  "daily-flags-heading",
                  "Flags raised",
                  dailyFlagLines(view.report).map((f) => `${f.heading}. ${f.lines.join(" ")}`),
                  "No flag was raised this day.",
                ],
                [
                  "daily-dispositions-heading",
                  "Dispositions recorded",
                  dailyDispositionLines(view.report),
                  "No disposition was recorded this day.",
                ],
                [
                  "daily-equipment-heading",
                  "Equipment sets and calibrations used",
                  dailyEquipmentLines(view.report).map(([name, text]) => `${name}: ${text}`),
                  "No equipment set was used this day.",
                ],
                [
                  "daily-concrete-heading",
                  "Concrete results entered",
                  dailyConcreteLines(view.report),
                  "No concrete result was entered this day.",
                ],
                [
                  "daily-tails-heading",
                  "Tails cut",
                  dailyTailCutLines(view.report),
                  "No tendon had its tails cut this day.",
                ],
              ] as const
            ).map(([id, title, items, empty]) => (
              <List key={id} id={id} title={title} items={[...items]} empty={empty} />
            ))}
          </div>

          <Section id="daily-signature-heading" title="Remarks and signature">
            <DailySigning
              projectId={projectId}
              day={day}
              revisions={view.revisions.map((r) => ({
                revision: r.revision,
                signerName: r.signerName,
                licence: r.licence,
                signedAt: formatDateTime(r.signedAt, view.report.timeZone),
                fileSha256: r.fileSha256,
                changes: r.changes,
              }))}
              current={view.current}
              remarks={view.report.remarks}
              canSign={can(access.role, "report.sign")}
              signerName={access.user.name}
              defaultStatement={DEFAULT_DAILY_STATEMENT}
              groups={witnessGroupViews(view.report)}
              exceptions={openExceptionLines(view.report)}
              previous={view.report.attestation}
            />
          </Section>
        </>
      )}
    </main>
  );
}

/** The statement of conformance, the open exceptions one per line under it. */
function Conformance({ statement, exceptions }: { statement: string; exceptions: string[] }) {
  return (
    <div data-testid="daily-conformance">
      <p>{statement}</p>
      {exceptions.length > 0 && (
        <ul className="list-disc pl-6">
          {exceptions.map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
      )}
    </div>
  );
}
