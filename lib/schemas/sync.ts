import { z } from "zod";

/**
 * The sync protocol between the tablet's outbox and the server, shared by the sync client and
 * the route handlers. Each operation carries a client-made id that is a permanent idempotency
 * key: the server answers applied | duplicate | conflict | rejected per operation.
 */

/**
 * create and revise carry a stressing record; tails_cut records a tendon's tails cut
 * (lib/schemas/tail-cut.ts); liftoff_check a lift-off check ordered by a disposition (lib/schemas/liftoff.ts);
 * detension a detension ordered by a disposition (lib/schemas/detension.ts).
 */
export const OP_KINDS = ["create", "revise", "tails_cut", "liftoff_check", "detension"] as const;
export type OpKind = (typeof OP_KINDS)[number];

/** "retry-later": nothing was stored for this op; the tablet keeps it and sends it again. */
export const OP_STATUSES = ["applied", "duplicate", "conflict", "rejected", "retry-later"] as const;
export type OpStatus = (typeof OP_STATUSES)[number];

/** Most operations one push may carry; the client sends batches of 25–50. */
export const MAX_OPS_PER_PUSH = 100;

export const deviceIdSchema = z
  .string({ error: "Send the device id." })
  .regex(/^[A-Za-z0-9_-]{8,64}$/, "The device id is 8 to 64 letters, digits, dashes or underscores.");

/** The envelope of one operation; its payload is checked per operation, so one bad op spoils only itself. */
export const syncOpSchema = z
  .object({
    opId: z.uuid({ error: "Each operation needs a UUID opId." }),
    kind: z.enum(OP_KINDS, {
      error: "The kind of operation must be create, revise, tails_cut, liftoff_check or detension.",
    }),
    recordId: z.uuid({ error: "Each operation needs the record's UUID." }),
    baseVersion: z.number().int().min(1).optional(),
    payload: z.unknown(),
  })
  .strict();
export type SyncOp = z.infer<typeof syncOpSchema>;

export const pushRequestSchema = z
  .object({
    deviceId: deviceIdSchema,
    ops: z
      .array(syncOpSchema, { error: "Send the operations as a list." })
      .min(1, "Send at least one operation.")
      .max(MAX_OPS_PER_PUSH, `Send at most ${MAX_OPS_PER_PUSH} operations at a time.`),
  })
  .strict()
  .superRefine((body, ctx) => {
    const seen = new Set<string>();
    body.ops.forEach((op, i) => {
      if (seen.has(op.opId))
        ctx.addIssue({ code: "custom", path: ["ops", i, "opId"], message: "The same opId appears twice in one push." });
      seen.add(op.opId);
    });
  });
export type PushRequest = z.infer<typeof pushRequestSchema>;

/** The server's cursor is xid8 as decimal text. "0" asks for everything. */
export const cursorSchema = z.string().regex(/^\d{1,20}$/, "The cursor is the number the last pull returned.");

export const pullQuerySchema = z.object({
  cursor: cursorSchema.default("0"),
  pours: z
    .string({ error: "Name the pours to pull, comma-separated." })
    .transform((s) =>
      s
        .split(",")
        .map((p) => p.trim())
        .filter(Boolean),
    )
    .pipe(
      z
        .array(z.uuid({ error: "Each pour must be a UUID." }))
        .min(1, "Name at least one pour.")
        .max(20, "Pull at most 20 pours at a time."),
    ),
});
export type PullQuery = z.infer<typeof pullQuerySchema>;

export const fieldPourParamsSchema = z.object({ pourId: z.uuid({ error: "Not a pour id." }) });

// What the server answers (push results, pulls, the pours to take out): the response schemas and
// their types live beside these, in ./sync-response.ts (zod/mini, for the tablet's sync chunk).
export type {
  AvailablePour,
  AvailablePoursResponse,
  FieldCalibration,
  FieldDetension,
  FieldDisposition,
  FieldEquipmentSet,
  FieldEvaluation,
  FieldFlag,
  FieldLiftoffCheck,
  FieldLiftoffResult,
  FieldPour,
  FieldProject,
  FieldRecord,
  FieldStrandLot,
  FieldTailCut,
  FieldTendon,
  OpError,
  OpEvaluation,
  OpResult,
  PullResponse,
  PushResponse,
  Tombstone,
} from "./sync-response";
