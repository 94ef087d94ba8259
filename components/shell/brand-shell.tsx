import Link from "next/link";
import type { ReactNode } from "react";
import { BrandMark } from "./brand-mark";

/** The frame of the pages outside the office shell: the name linking home, then the page. */
export function BrandShell({ className, children }: { className: string; children: ReactNode }) {
  return (
    <main className={`mx-auto px-6 ${className}`}>
      <Link href="/" className="flex min-h-touch items-center gap-2 text-lead font-bold no-underline">
        <BrandMark className="h-8 w-8" />
        Tautline
      </Link>
      {children}
    </main>
  );
}
