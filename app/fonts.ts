import localFont from "next/font/local";

// Atkinson Hyperlegible Next (SIL Open Font License, see fonts/OFL-LICENSE.txt), shipped with
// the app so no page ever asks another host for a font. `optional`: the page paints in this font
// when it is there at once (preloaded, or from the offline worker's cache on the tablet), else in
// the system's sans for that page view, and never swaps fonts under text already on screen (a
// swap moved the review queue's content by 0.10 CLS, the fallback's metrics being Arial's, which
// Linux and Android tablets do not have).
export const sans = localFont({
  src: [
    { path: "./fonts/atkinson-hyperlegible-next-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "./fonts/atkinson-hyperlegible-next-latin-600-normal.woff2", weight: "600", style: "normal" },
    { path: "./fonts/atkinson-hyperlegible-next-latin-700-normal.woff2", weight: "700", style: "normal" },
  ],
  variable: "--font-sans",
  display: "optional",
});
