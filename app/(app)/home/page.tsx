import Link from "next/link";
import { NAV_ITEMS } from "@/lib/navigation";

export const metadata = { title: "Today" };

export default function HomePage() {
  const areas = NAV_ITEMS.filter((item) => item.href !== "/home");
  return (
    <main>
      <h1 className="text-figure font-bold">Today</h1>
      <p className="mt-2 text-ink-soft">Each person on a project sees the parts of Tautline that belong to their role.</p>
      <ul className="mt-6 grid gap-4 md:grid-cols-2">
        {areas.map((area) => (
          <li key={area.href} className="card">
            <h2 className="text-lead font-semibold">
              <Link href={area.href}>{area.label}</Link>
            </h2>
            <p className="mt-1 text-ink-soft">{area.description}</p>
            <p className="mt-3 text-label uppercase text-ink-faint">For: {area.roles.join(", ")}</p>
          </li>
        ))}
      </ul>
    </main>
  );
}
