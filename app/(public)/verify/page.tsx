import { VerifyReportForm } from "@/components/reports/verify-report-form";

export const metadata = { title: "Check a signed report" };

export default function VerifyReportPage() {
  return (
    <div className="card space-y-4">
      <h1 className="text-figure font-bold">Check a signed report</h1>
      <p className="text-ink-soft">
        Pick a signed stressing report you were given. Your browser computes the file&apos;s sha256 and asks Tautline
        whether a signed revision has exactly that content; the file itself is not sent.
      </p>
      <VerifyReportForm />
    </div>
  );
}
