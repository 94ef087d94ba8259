"use client";
import dynamic from "next/dynamic";
import { FieldGate } from "./field-provider";

// Each field screen's code (its reads of the tablet's database, the tendon list, the signing forms)
// loads after the page's frame has painted, fetched beside the shell's database code; the screen
// shows once both are there. The offline worker precaches every chunk, so none of this needs signal.

const readingWords = <p role="status">Reading the tablet&apos;s storage…</p>;

function Reading() {
  return <main className="mx-auto grid max-w-6xl gap-6 px-4 py-6">{readingWords}</main>;
}

/** Starts fetching a screen's code while the page hydrates (once: the bundler keeps the promise). */
function preload(load: () => Promise<unknown>) {
  if (typeof window !== "undefined") void load().catch(() => undefined);
}

const loadHome = () => import("./field-home").then((m) => m.FieldHome);
const loadPourLog = () => import("./pour-log").then((m) => m.PourLog);
const loadSigning = () => import("./field-signing").then((m) => m.FieldSigning);

// The landing's page holds its heading and lead (server HTML); only this line waits below them.
const FieldHome = dynamic(loadHome, { ssr: false, loading: () => readingWords });
const PourLog = dynamic(loadPourLog, { ssr: false, loading: () => <Reading /> });
const FieldSigning = dynamic(loadSigning, {
  ssr: false,
  loading: () => (
    <main className="mx-auto grid max-w-3xl gap-4 p-4">
      <h1 className="text-figure font-bold">Sign reports</h1>
      <p role="status">Opening…</p>
    </main>
  ),
});

/** The field log's landing. */
export function FieldHomeScreen() {
  preload(loadHome);
  return (
    <FieldGate placeholder={readingWords}>
      <FieldHome />
    </FieldGate>
  );
}

/** A pour's tendons and the record form. */
export function PourLogScreen() {
  preload(loadPourLog);
  return (
    <FieldGate placeholder={<Reading />}>
      <PourLog />
    </FieldGate>
  );
}

/** Signing the reports: reads the server, not the tablet's database, so it does not wait for it. */
export function FieldSigningScreen() {
  return <FieldSigning />;
}
