import { z } from "zod";

/**
 * "Tails cut" on one tendon, as the tablet's outbox sends it (op kind tails_cut; the op's
 * recordId is the cut's id). Who and when: the person signed in on the tablet and the device's
 * time. The server decides again whether the tendon was clear (lib/stressing/tail-clearance.ts).
 */
export const tailCutPayloadSchema = z
  .object({
    projectId: z.uuid({ error: "Name the project." }),
    pourId: z.uuid({ error: "Name the pour." }),
    tendonId: z.uuid({ error: "Name the tendon." }),
    cutAt: z.iso.datetime({ offset: true, error: "The time of the cut must be an ISO date and time." }),
    authorUserId: z.uuid({ error: "Name the person who cut the tails." }),
  })
  .strict();
export type TailCutPayload = z.infer<typeof tailCutPayloadSchema>;
