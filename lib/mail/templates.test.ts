import { describe, expect, it } from "vitest";
import { flagMail } from "./templates";

const base = {
  to: ["eor@example.test"],
  projectName: "Demo job",
  pourName: "L2 Pour 2",
  tendonTag: "2-2-U17",
  verdictLine: "short, −9.0 %",
  basisLine: "Gross at jacking, ±7 % band.",
  url: "https://app.example.test/projects/p/tendons/t/flags",
};

describe("the flag e-mail", () => {
  it("links to the tendon's page with the first new flag named, so the page opens on it", () => {
    const mail = flagMail({
      ...base,
      flags: [
        { id: "0190c3a4-0000-7000-8000-000000000001", kind: "out_of_band", reason: "Short by 9 %." },
        { id: "0190c3a4-0000-7000-8000-000000000002", kind: "wire_break", reason: "One wire broke." },
      ],
    });
    expect(mail.text).toContain(`${base.url}?flag=0190c3a4-0000-7000-8000-000000000001`);
    expect(mail.html).toContain(`${base.url}?flag=0190c3a4-0000-7000-8000-000000000001`);
    expect(mail.text).not.toContain("000000000002\n");
  });

  it("names each flag by its project reference, as the screens do", () => {
    const mail = flagMail({
      ...base,
      flags: [
        {
          id: "0190c3a4-0000-7000-8000-000000000001",
          reference: "F-0012",
          kind: "out_of_band",
          reason: "Short by 9 %.",
        },
      ],
    });
    expect(mail.text).toContain("Flag F-0012 (Out of band): Short by 9 %.");
    expect(mail.html).toContain("Flag F-0012 (Out of band)");
  });

  it("keeps the plain link when the flags carry no id", () => {
    const mail = flagMail({ ...base, flags: [{ kind: "out_of_band", reason: "Short by 9 %." }] });
    expect(mail.text).toContain(`${base.url}\n`);
    expect(mail.text).not.toContain("?flag=");
  });
});
