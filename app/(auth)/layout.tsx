import Link from "next/link";
import type { ReactNode } from "react";
import { BrandMark } from "@/components/shell/brand-mark";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <main className="mx-auto max-w-lg px-6 py-12">
      <Link href="/" className="flex min-h-touch items-center gap-2 text-lead font-bold no-underline">
        <BrandMark className="h-8 w-8" />
        Tautline
      </Link>
      <div className="card mt-8">{children}</div>
    </main>
  );
}
