import localFont from "next/font/local";

// Atkinson Hyperlegible Next (SIL Open Font License, see fonts/OFL-LICENSE.txt), shipped with
// the app so no page ever asks another host for a font.
export const sans = localFont({
  src: [
    { path: "./fonts/atkinson-hyperlegible-next-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "./fonts/atkinson-hyperlegible-next-latin-600-normal.woff2", weight: "600", style: "normal" },
    { path: "./fonts/atkinson-hyperlegible-next-latin-700-normal.woff2", weight: "700", style: "normal" },
  ],
  variable: "--font-sans",
  display: "swap",
});
