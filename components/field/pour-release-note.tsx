import { formatDateTime } from "@/lib/format/dates";
import type { FieldPour } from "@/lib/schemas/sync";

const STATUS_WORDS: Record<string, string> = {
  planned: "planned",
  stressing: "stressing",
  stressed: "stressed: every end recorded",
  released: "released",
};

/**
 * What the last sync said of the pour's release: released (and so closed to new records), or
 * reopened by the engineer with the reason. Pours pulled before releases were synced carry neither.
 */
export function PourReleaseNote({
  pour,
  timeZone,
}: {
  pour: Pick<FieldPour, "name" | "status"> & Partial<Pick<FieldPour, "release" | "reopened">>;
  /** The project's time zone: the release is dated at the site, as on the office screens. */
  timeZone: string;
}) {
  if (pour.release) {
    return (
      <div className="rounded-md border-2 border-ink bg-concrete-100 p-3" data-testid="pour-frozen" role="status">
        <p className="font-bold">
          Released by {pour.release.by} on {formatDateTime(pour.release.at, timeZone)}. No new record or restress can be
          saved for {pour.name}.
        </p>
        <p className="text-ink-soft">If more work is needed, the engineer of record must reopen the pour first.</p>
      </div>
    );
  }
  return (
    <>
      <p className="text-ink-soft" data-testid="pour-status">
        Pour {STATUS_WORDS[pour.status] ?? pour.status}
      </p>
      {pour.reopened && (
        <p
          className="rounded-md border-2 border-signal-stop bg-signal-stop-bg p-3 font-semibold text-signal-stop"
          data-testid="pour-reopened"
        >
          Reopened by {pour.reopened.by} on {formatDateTime(pour.reopened.at, timeZone)}: {pour.reopened.reason}
        </p>
      )}
    </>
  );
}
