import Link from "next/link";
import type { NavItem } from "@/lib/navigation";
import { BrandMark } from "./brand-mark";

export function AppNav({ items, current }: { items: NavItem[]; current?: string }) {
  return (
    <nav aria-label="Main" className="border-b-2 border-ink bg-white">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-2 px-4 py-2">
        <Link href="/home" className="mr-4 flex min-h-touch items-center gap-2 font-bold no-underline">
          <BrandMark className="h-7 w-7" />
          Tautline
        </Link>
        <ul className="flex flex-wrap gap-1">
          {items.map((item) => (
            <li key={item.href}>
              <Link
                href={item.href}
                aria-current={current === item.href ? "page" : undefined}
                className="flex min-h-touch items-center rounded-md px-4 font-semibold no-underline hover:bg-concrete-100 aria-[current=page]:bg-ink aria-[current=page]:text-concrete-50"
              >
                {item.label}
              </Link>
            </li>
          ))}
        </ul>
      </div>
    </nav>
  );
}
