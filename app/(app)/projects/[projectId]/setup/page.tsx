import Link from "next/link";
import { SettingsForm } from "@/components/setup/settings-form";
import { SetupTabs } from "@/components/setup/setup-tabs";
import { db } from "@/db";
import { findSetupGaps } from "@/lib/server/find-setup-gaps";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { pageAccess } from "../page-access";

export const metadata = { title: "Project settings" };

export default async function ProjectSetupPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const access = await pageAccess("project.configure", projectId);
  const [{ id: _id, code: _code, ...settings }, { gaps, counts }] = await Promise.all([
    getProjectSettings(db, projectId),
    findSetupGaps(db, projectId),
  ]);
  void _id;
  void _code;
  return (
    <main>
      <SetupTabs projectId={projectId} projectName={access.projectName} current="setup" />
      <h1 className="text-figure font-bold">Settings</h1>
      <p className="mt-2 text-ink-soft">
        {counts.pours} pours · {counts.tendons} tendons · {counts.lots} strand lots · {counts.sets} equipment sets
      </p>
      <section aria-labelledby="gaps-heading" className="card mt-6">
        <h2 id="gaps-heading" className="text-lead font-semibold">
          {gaps.length ? `Still to do before stressing (${gaps.length})` : "Nothing missing"}
        </h2>
        {gaps.length ? (
          <ul className="mt-2 list-disc space-y-1 pl-6">
            {gaps.map((g) => (
              <li key={g.what}>
                <Link href={g.href}>{g.what}</Link>
              </li>
            ))}
          </ul>
        ) : (
          <p className="mt-2">The project has pours, tendons, strand lots and calibrated equipment.</p>
        )}
      </section>
      <div className="mt-6">
        <SettingsForm projectId={projectId} settings={settings} />
      </div>
    </main>
  );
}
