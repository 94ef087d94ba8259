import Link from "next/link";

const TABS = [
  { key: "setup", label: "Settings" },
  { key: "pours", label: "Pours and tendons" },
  { key: "strand-lots", label: "Strand lots" },
  { key: "equipment", label: "Equipment sets" },
  { key: "members", label: "People" },
] as const;

/** The parts of one project's setup, with the current one marked for screen readers and the eye. */
export function SetupTabs({
  projectId,
  projectName,
  current,
}: {
  projectId: string;
  projectName: string;
  current: (typeof TABS)[number]["key"];
}) {
  return (
    <header className="mb-6">
      <p className="field-label">
        <Link href="/setup">Project setup</Link> · {projectName}
      </p>
      <nav aria-label="Project setup" className="mt-3">
        <ul className="flex flex-wrap gap-2">
          {TABS.map((t) => (
            <li key={t.key}>
              <Link
                href={`/projects/${projectId}/${t.key}`}
                aria-current={t.key === current ? "page" : undefined}
                className={t.key === current ? "btn-primary" : "btn-quiet"}
              >
                {t.label}
              </Link>
            </li>
          ))}
        </ul>
      </nav>
    </header>
  );
}
