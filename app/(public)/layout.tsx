import type { ReactNode } from "react";
import { BrandShell } from "@/components/shell/brand-shell";

/** Pages anyone may open without an account: report verification and the shared status board. */
export default function PublicLayout({ children }: { children: ReactNode }) {
  return (
    <BrandShell className="max-w-5xl py-10">
      <div className="mt-8">{children}</div>
    </BrandShell>
  );
}
