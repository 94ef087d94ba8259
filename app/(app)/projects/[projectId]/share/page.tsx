import { ShareLinks } from "@/components/reports/share-links";
import { db } from "@/db";
import { formatDateTime } from "@/lib/format/dates";
import { listShareLinks } from "@/lib/server/manage-share-links";
import { pageAccess } from "../page-access";

export const metadata = { title: "Read-only links" };

export default async function ShareLinksPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const access = await pageAccess("share.manage", projectId);
  const { links } = await listShareLinks(db, { projectId });
  return (
    <main className="space-y-6">
      <header>
        <p className="text-label uppercase text-ink-faint">{access.projectName}</p>
        <h1 className="text-figure font-bold">Read-only links</h1>
        <p className="mt-1 text-ink-soft">
          A link opens the pours&apos; status and the signed stressing reports without an account, until it expires or
          you revoke it. Every view is recorded.
        </p>
      </header>
      <ShareLinks
        projectId={projectId}
        links={links.map((l) => ({
          id: l.id,
          label: l.label,
          createdBy: l.createdBy,
          expires: formatDateTime(l.expiresAt, "UTC"),
          state: l.state,
        }))}
      />
    </main>
  );
}
