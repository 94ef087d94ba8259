import { z } from "zod";
import { text } from "./text";

/**
 * A lift-off check as the tablet's outbox sends it (op kind liftoff_check; the op's recordId is
 * the check's id): the gauge pressure at lift-off exactly as typed, with the unit a bare number
 * is read in, at one end with one equipment set, answering the engineer's disposition that
 * ordered it. Who and when: the person signed in on the tablet and the device's time. The server
 * reads the pressure again, converts it on the calibration in force that day and judges it
 * (lib/stressing/liftoff.ts).
 */
export const liftoffPayloadSchema = z
  .object({
    projectId: z.uuid({ error: "Name the project." }),
    pourId: z.uuid({ error: "Name the pour." }),
    tendonId: z.uuid({ error: "Name the tendon." }),
    dispositionId: z.uuid({ error: "Name the engineer's disposition that ordered the lift-off check." }),
    tendonEnd: z.enum(["A", "B"], { error: "Choose the end the lift-off was read at (A or B)." }),
    equipmentSetId: z.uuid({ error: "Choose the equipment set used." }),
    pressure: text({ error: "Type the lift-off gauge pressure." })
      .trim()
      .min(1, "Type the lift-off gauge pressure.")
      .max(40, "Keep the lift-off gauge pressure under 40 characters."),
    pressureUnit: z.enum(["psi", "MPa"], { error: "The pressure unit must be psi or MPa." }),
    checkedAt: z.iso.datetime({ offset: true, error: "The time of the check must be an ISO date and time." }),
    authorUserId: z.uuid({ error: "Name the person who made the check." }),
  })
  .strict();
export type LiftoffPayload = z.infer<typeof liftoffPayloadSchema>;
