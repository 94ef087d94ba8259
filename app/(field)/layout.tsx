import type { Metadata } from "next";
import type { ReactNode } from "react";
import { FieldProvider } from "@/components/field/field-provider";
import { SyncStatusBar } from "@/components/field/sync-status-bar";
import { UpdatePrompt } from "@/components/field/update-prompt";
import { BrandMark } from "@/components/shell/brand-mark";

export const metadata: Metadata = {
  manifest: "/manifest.webmanifest",
  appleWebApp: { capable: true, title: "Tautline field log" },
};

// The tablet shell. Its pages are static and hold no data: the offline worker keeps them, and
// everything they show comes from the tablet's own database or from route handlers that check
// access themselves (a signed-out tablet keeps working and is asked to sign in to send).
export default function FieldLayout({ children }: { children: ReactNode }) {
  return (
    <FieldProvider>
      <div className="min-h-screen text-body">
        <header className="flex items-center gap-3 bg-ink px-4 py-2 text-concrete-50">
          <a href="/field" className="flex min-h-touch items-center gap-2 font-bold text-concrete-50 no-underline">
            <BrandMark className="h-7 w-7" />
            Tautline · Field log
          </a>
          <a href="/home" className="ml-auto flex min-h-touch items-center px-3 font-semibold text-concrete-50">
            Office screens
          </a>
        </header>
        <SyncStatusBar />
        <UpdatePrompt />
        {children}
      </div>
    </FieldProvider>
  );
}
