import type { ReactNode } from "react";
import { AppNav } from "@/components/shell/app-nav";
import { NAV_ITEMS } from "@/lib/navigation";

export default function SignedInLayout({ children }: { children: ReactNode }) {
  return (
    <div className="min-h-screen">
      <AppNav items={[...NAV_ITEMS]} />
      <div className="mx-auto max-w-6xl px-4 py-8">{children}</div>
    </div>
  );
}
