import { FlagMailForm } from "@/components/mail/flag-mail-form";
import { db } from "@/db";
import { formatDateTime } from "@/lib/format/dates";
import { getFlagMail } from "@/lib/server/get-flag-mail";
import { formatShiftEnd } from "@/lib/stressing/shift";
import { pageAccess } from "../page-access";

export const metadata = { title: "Your flag e-mails" };
export const dynamic = "force-dynamic";

export default async function FlagMailPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const access = await pageAccess("flag_mail.choose", projectId);
  const choice = await getFlagMail(db, { projectId, userId: access.user.id });
  return (
    <main className="max-w-3xl space-y-6">
      <header>
        <p className="text-label uppercase text-ink-faint">{access.projectName}</p>
        <h1 className="text-figure font-bold">Your flag e-mails</h1>
        <p className="mt-1 text-ink-soft">
          Your own choice on this project; it changes nothing for anyone else. The project&apos;s shifts end at{" "}
          {choice.shiftEnds.map(formatShiftEnd).join(", ")} ({choice.timeZone}); the next ends{" "}
          {formatDateTime(choice.nextEnd, choice.timeZone)}.
        </p>
        {!choice.listed && (
          <p className="mt-2 border-l-4 border-signal-stop pl-2 font-semibold" data-testid="flag-mail-unlisted">
            The project&apos;s settings do not list your address for flag e-mails, so no e-mail per flag comes to you;
            the project admin adds it under the project&apos;s settings. A digest you choose here comes to you either
            way.
          </p>
        )}
      </header>
      <FlagMailForm
        projectId={projectId}
        mode={choice.mode}
        shiftEnds={choice.shiftEnds.map(formatShiftEnd).join(", ")}
        nextEnd={formatDateTime(choice.nextEnd, choice.timeZone)}
      />
    </main>
  );
}
