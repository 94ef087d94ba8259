import type { Metadata, Viewport } from "next";
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

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={sans.variable}>
      <body className="min-h-screen">{children}</body>
    </html>
  );
}
