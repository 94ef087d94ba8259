import Link from "next/link";
import type { NavItem } from "@/lib/navigation";
import { BrandMark } from "./brand-mark";
import { SignOutButton } from "./sign-out-button";

export function AppNav({ items, userName }: { items: NavItem[]; userName: string }) {
  return (
    <nav aria-label="Main" className="border-b-2 border-ink bg-white">
      <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-2 px-4 py-2">
        <Link href="/home" className="mr-4 flex min-h-touch items-center gap-2 font-bold no-underline">
          <BrandMark className="h-7 w-7" />
          Tautline
        </Link>
        <ul className="flex flex-1 flex-wrap gap-1">
          {items.map((item) => (
            <li key={item.href}>
              <Link
                href={item.href}
                className="flex min-h-touch items-center rounded-md px-4 font-semibold no-underline hover:bg-concrete-100"
              >
                {item.label}
              </Link>
            </li>
          ))}
        </ul>
        <span className="text-label text-ink-faint" data-testid="signed-in-as">
          {userName}
        </span>
        <SignOutButton />
      </div>
    </nav>
  );
}
