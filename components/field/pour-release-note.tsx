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
}: {
  pour: Pick<FieldPour, "name" | "status"> & Partial<Pick<FieldPour, "release" | "reopened">>;
}) {
  if (pour.release) {
    return (
      <div className="rounded-md border-2 border-ink bg-concrete-100 p-3" data-testid="pour-frozen" role="status">
        <p className="font-bold">
          Released by {pour.release.by} on {new Date(pour.release.at).toLocaleDateString("en-CA")}. No new record or
          restress can be saved for {pour.name}.
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
          Reopened by {pour.reopened.by} on {new Date(pour.reopened.at).toLocaleDateString("en-CA")}:{" "}
          {pour.reopened.reason}
        </p>
      )}
    </>
  );
}
