import { z } from "zod";
import { text } from "./text";

/**
 * A detension as the tablet's outbox sends it (op kind detension; the op's recordId is the
 * detension's id), answering the engineer's disposition that ordered it (decision
 * detension_restress): when the strands were released, who ran the jack, with which equipment
 * set, the gauge pressure at release when it was read (exactly as typed, with the unit a bare
 * number is read in), how many strands were released, and remarks. The person signed in on the
 * tablet is who recorded it.
 */
export const detensionPayloadSchema = z
  .object({
    projectId: z.uuid({ error: "Name the project." }),
    pourId: z.uuid({ error: "Name the pour." }),
    tendonId: z.uuid({ error: "Name the tendon." }),
    dispositionId: z.uuid({ error: "Name the engineer's disposition that ordered the detension." }),
    detensionedAt: z.iso.datetime({ offset: true, error: "The time of the detension must be an ISO date and time." }),
    operatorName: text({ error: "Type who ran the jack." })
      .trim()
      .min(2, "Type who ran the jack (at least 2 characters).")
      .max(80, "Keep the operator's name under 80 characters."),
    equipmentSetId: z.uuid({ error: "Choose the equipment set used." }),
    pressure: text({ error: "The gauge pressure at release must be text." })
      .trim()
      .max(40, "Keep the gauge pressure at release under 40 characters.")
      .optional(),
    pressureUnit: z.enum(["psi", "MPa"], { error: "The pressure unit must be psi or MPa." }),
    strandsDetensioned: z
      .number({ error: "Type how many strands were detensioned." })
      .int("Type a whole number of strands.")
      .min(1, "At least one strand is detensioned.")
      .max(100, "A tendon has at most 100 strands."),
    remarks: text({ error: "Remarks must be text." })
      .trim()
      .max(1000, "Keep the remarks under 1000 characters.")
      .optional(),
    authorUserId: z.uuid({ error: "Name the person who recorded the detension." }),
  })
  .strict();
export type DetensionPayload = z.infer<typeof detensionPayloadSchema>;
