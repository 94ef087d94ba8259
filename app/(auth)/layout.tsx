import type { ReactNode } from "react";
import { BrandShell } from "@/components/shell/brand-shell";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <BrandShell className="max-w-lg py-12">
      <div className="card mt-8">{children}</div>
    </BrandShell>
  );
}
