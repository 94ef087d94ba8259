import type { Metadata, Viewport } from "next";
import { connection } from "next/server";
import type { ReactNode } from "react";
import { sans } from "./fonts";
import "./globals.css";

export const metadata: Metadata = {
  title: { default: "Tautline", template: "%s · Tautline" },
  description:
    "Stressing records for post-tensioned concrete: a field log that works without signal, elongation checks, flags and the engineer's disposition.",
  applicationName: "Tautline",
  icons: { icon: "/icon.svg" },
};

export const viewport: Viewport = {
  themeColor: "#14213d",
  width: "device-width",
  initialScale: 1,
};

// Every page is rendered per request, so Next.js can put the request's CSP nonce (proxy.ts) on
// its scripts; a page prerendered at build time would carry none and its scripts would not run.
export default async function RootLayout({ children }: { children: ReactNode }) {
  await connection();
  return (
    <html lang="en" className={sans.variable}>
      <body className="min-h-screen">{children}</body>
    </html>
  );
}
