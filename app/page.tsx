import Link from "next/link";
import { BrandMark } from "@/components/shell/brand-mark";
import { Caution } from "@/components/ui/caution";

const ROLES = [
  {
    title: "Stressing crew",
    text: "Take the pour out on a tablet before the shift. Pick a tendon, see the gauge pressure to pull to, enter pressures and readings per end with gloves on and no signal. Every record is kept on the tablet at once and shows a first verdict.",
  },
  {
    title: "Special inspector",
    text: "Watch the pour as records arrive. Every tendon outside the band, over force or on an expired calibration waits in one list with its photos and the computation behind it. Add findings and pass it to the engineer.",
  },
  {
    title: "Engineer of record",
    text: "An e-mail arrives within a minute of the sync. Open the flag, read the calculation step by step, record a disposition with written reasons, and release the pour for tail cutting or grouting when nothing is open.",
  },
  {
    title: "Detailer or project manager",
    text: "Set the tolerance rule and friction values, import the tendon schedule, register equipment sets with their calibrations and strand lots with their mill certificates, and invite the people on the job.",
  },
] as const;

export default function LandingPage() {
  return (
    <main className="mx-auto max-w-5xl px-6 py-10">
      <header className="flex items-center gap-3">
        <BrandMark className="h-10 w-10 text-ink" />
        <span className="text-lead font-bold tracking-tight">Tautline</span>
      </header>

      <section className="mt-12 max-w-3xl">
        <h1 className="text-hero font-bold tracking-tight">
          Every tendon, measured against what it should have stretched.
        </h1>
        <p className="mt-5 text-lead text-ink-soft">
          Tautline is the stressing log for post-tensioned concrete. The crew records gauge pressure and elongation for
          each tendon end at the slab edge, offline. The server compares each reading with the predicted elongation,
          accounting for friction, anchor set and the strand inside the jack, flags what is outside the project&apos;s
          tolerance, and tells the engineer of record at once.
        </p>
        <div className="mt-8 flex flex-wrap gap-4">
          <Link href="/sign-in" className="btn-primary">
            Sign in
          </Link>
          <a href="#who" className="btn-quiet">
            Who it is for
          </a>
        </div>
      </section>

      <section id="who" aria-labelledby="who-heading" className="mt-16">
        <h2 id="who-heading" className="text-figure font-bold">
          One record, four people
        </h2>
        <ul className="mt-6 grid gap-5 md:grid-cols-2">
          {ROLES.map((role) => (
            <li key={role.title} className="card">
              <h3 className="text-lead font-semibold">{role.title}</h3>
              <p className="mt-2 text-ink-soft">{role.text}</p>
            </li>
          ))}
        </ul>
      </section>

      <Caution className="mt-16" />

      <footer className="mt-10 border-t border-concrete-300 pt-6 text-label text-ink-faint">
        Tautline keeps stressing records; it does not design tendons or certify structures.
      </footer>
    </main>
  );
}
