import { headers } from "next/headers";
import { notFound } from "next/navigation";
import { db, momentOld } from "@/db";
import { isAppError } from "@/lib/errors";
import { formatDateTime } from "@/lib/format/dates";
import { shareTokenSchema } from "@/lib/schemas/share-link";
import { getShareBoard } from "@/lib/server/get-share-board";
import { boardStatusText } from "@/lib/stressing/pour-status";

export const metadata = { title: "Pour status", robots: { index: false } };
export const dynamic = "force-dynamic";

/**
 * The read-only status board a link opens, without an account: each pour's state and its signed
 * stressing reports. Nothing here can be changed; every view is audited.
 */
export default async function SharedBoardPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const forwarded = (await headers()).get("x-forwarded-for")?.split(",")[0]?.trim() ?? null;
  // A token that is not one of ours, or was never issued, answers 404 with the not-found state.
  if (!shareTokenSchema.safeParse(token).success) notFound();
  const board = await getShareBoard(db, momentOld, { token, ip: forwarded }).catch((e: unknown) => {
    if (isAppError(e) && e.code === "GONE") return null;
    if (isAppError(e) && e.code === "NOT_FOUND") notFound();
    throw e;
  });
  if (!board)
    return (
      <div className="card space-y-3">
        <h1 className="text-figure font-bold">This link has ended</h1>
        <p>It has expired or was revoked. Ask the project team for a new one.</p>
      </div>
    );
  return (
    <div className="space-y-6">
      <header>
        <p className="text-label uppercase text-ink-faint">Read-only status for {board.label}</p>
        <h1 className="text-figure font-bold">
          {board.project.name} ({board.project.code})
        </h1>
        {board.project.address && <p className="text-ink-soft">{board.project.address}</p>}
        <p className="mt-1 text-ink-soft">
          This link works until {formatDateTime(board.expiresAt, board.project.timeZone)}.
        </p>
      </header>
      <table className="w-full border-collapse text-left" aria-label="Pours">
        <thead>
          <tr className="border-b-2 border-ink">
            <th className="py-2 pr-4">Pour</th>
            <th className="py-2 pr-4">Status</th>
            <th className="py-2 pr-4">Tendons complete</th>
            <th className="py-2">Signed stressing reports</th>
          </tr>
        </thead>
        <tbody>
          {board.pours.map((p) => (
            <tr key={p.pourId} className="border-b border-concrete-300 align-top" data-pour={p.name}>
              <td className="whitespace-nowrap py-2 pr-4 font-semibold">
                {p.name}
                {p.level ? <span className="block text-label text-ink-soft">{p.level}</span> : null}
              </td>
              <td className="py-2 pr-4" data-status={p.status}>
                {boardStatusText(p)}
                {p.release && (
                  <span className="mt-1 block text-label text-ink-soft" data-testid="release-signature">
                    Release signed by {p.release.signerName} (licence {p.release.licence}),{" "}
                    {formatDateTime(p.release.signedAt, board.project.timeZone)}; report sha256 at signing{" "}
                    <span className="break-all font-mono">{p.release.contentSha256}</span>
                  </span>
                )}
              </td>
              <td className="py-2 pr-4">
                {p.complete} of {p.tendons}
              </td>
              <td className="py-2">
                {p.signed.length === 0 ? (
                  <span className="text-ink-soft">None signed yet</span>
                ) : (
                  <ul className="space-y-1">
                    {p.signed.map((s, i) => (
                      <li key={s.revision}>
                        <a href={`/api/share/${token}/reports/${p.pourId}/${s.revision}`} download>
                          Revision {s.revision}
                        </a>{" "}
                        signed by {s.signerName}, {formatDateTime(s.signedAt, board.project.timeZone)}
                        {i > 0 ? " (superseded)" : ""}
                      </li>
                    ))}
                  </ul>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="text-label text-ink-soft">
        Held means a tendon has a flag the engineer of record has not yet closed; a released pour may have its tails
        cut. For the figures behind a status, read the signed report.
      </p>
    </div>
  );
}
