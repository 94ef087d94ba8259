import Link from "next/link";
import type { ReactNode } from "react";
import { BrandMark } from "@/components/shell/brand-mark";

/** Pages anyone may open without an account: report verification and the shared status board. */
export default function PublicLayout({ children }: { children: ReactNode }) {
  return (
    <main className="mx-auto max-w-5xl px-6 py-10">
      <Link href="/" className="flex min-h-touch items-center gap-2 text-lead font-bold no-underline">
        <BrandMark className="h-8 w-8" />
        Tautline
      </Link>
      <div className="mt-8">{children}</div>
    </main>
  );
}
