/**
 * The domain's closed sets of words, each written once: a list `as const`, its type taken from the
 * list, and the zod enums of the schemas built from the same list (`z.enum(ROLES, …)`). The database
 * types (`db/types.ts`) re-use these types for their columns; the PostgreSQL check constraints of
 * the migrations hold the same words.
 *
 * The tendon's own words (its ends, the comparison's verdicts) are the elongation engine's, which
 * imports nothing of the app: they are taken from `lib/elongation/types.ts`, the one place they are
 * written. Nothing else is imported here, so the database types, the tablet and the server may all
 * use it.
 */

import { COMPARISON_VERDICTS, STRESSED_ENDS } from "@/lib/elongation/types";

/** A person's role in a project. */
export const ROLES = ["crew", "inspector", "engineer", "admin"] as const;
export type Role = (typeof ROLES)[number];

/** The units a project shows and takes values in (US customary or SI). */
export const UNIT_SYSTEMS = ["us", "si"] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

/** The reading division as stored on the project (`lib/units` spells it for display: "1/8 in"). */
export const STORED_RESOLUTIONS = ["1/8in", "1/16in", "1mm"] as const;
export type StoredResolution = (typeof STORED_RESOLUTIONS)[number];

/** The basis a project usually compares on: gross at jacking or net of anchor set. */
export const COMPARISON_BASES = ["gross", "net"] as const;
export type ComparisonBasis = (typeof COMPARISON_BASES)[number];

/** Who releases a pour on a project. */
export const RELEASERS = ["engineer", "inspector"] as const;
export type Releaser = (typeof RELEASERS)[number];

/** Which prediction the verdict is judged against: ours or the approved shop drawing's. */
export const GOVERNING_VALUES = ["tautline", "shop_drawing"] as const;
export type GoverningValue = (typeof GOVERNING_VALUES)[number];

/** How a member receives flag e-mails: one per flag or one digest per shift. */
export const FLAG_MAIL_MODES = ["each", "digest"] as const;
export type FlagMailMode = (typeof FLAG_MAIL_MODES)[number];

/** Derived from records and the release (the pour_states view); never set by a form. */
export const POUR_STATUSES = ["planned", "stressing", "stressed", "released"] as const;
export type PourStatus = (typeof POUR_STATUSES)[number];

/** Concrete test specimens. */
export const CONCRETE_SPECIMENS = ["cylinder", "cube"] as const;
export type ConcreteSpecimen = (typeof CONCRETE_SPECIMENS)[number];

export const TENDON_KINDS = ["unbonded_monostrand", "bonded_multistrand"] as const;
export type TendonKind = (typeof TENDON_KINDS)[number];

/** The end(s) a tendon is stressed from (the engine's `STRESSED_ENDS`). */
export const STRESSING_ENDS = STRESSED_ENDS;
export type StressingEnds = (typeof STRESSING_ENDS)[number];

/** One end of a tendon (the engine's own list). */
export { TENDON_ENDS, type TendonEnd } from "@/lib/elongation/types";

/** How an elongation was read: marks after lock-off or ram strokes. */
export const READING_METHODS = ["marks", "strokes"] as const;
export type ReadingMethod = (typeof READING_METHODS)[number];

/** How the two ends of a two-end tendon were stressed. */
export const STRESSING_ORDERS = ["sequential", "simultaneous"] as const;
export type StressingOrder = (typeof STRESSING_ORDERS)[number];

/** The comparison's verdicts, and "incomplete" when a tendon cannot be judged yet. */
export const VERDICTS = [...COMPARISON_VERDICTS, "incomplete"] as const;
export type Verdict = (typeof VERDICTS)[number];

/** One kind per flag rule (`lib/stressing/rules/`), held by the `flags.kind` check too. */
export const FLAG_KINDS = [
  "out_of_band",
  "jacking_over_limit",
  "anchor_over_limit",
  "calibration_expired",
  "calibration_range",
  "wire_break",
  "concrete_unconfirmed",
  "reading_missing",
  "stressed_twice",
  "under_force",
  "seating_excess",
  "cut_while_held",
  "group_out_of_band",
  "member_wire_loss",
  "liftoff_out_of_band",
  "force_disagreement",
  "gauge_off_target",
] as const;
export type FlagKind = (typeof FLAG_KINDS)[number];

export const FLAG_STATUSES = ["open", "with_engineer", "closed"] as const;
export type FlagStatus = (typeof FLAG_STATUSES)[number];

/** What an inspector's review of a flag did. */
export const REVIEW_KINDS = [
  "note",
  "remeasured",
  "paperwork_error",
  "photo",
  "sent_to_engineer",
  "closed_paperwork",
] as const;
export type ReviewKind = (typeof REVIEW_KINDS)[number];

/** The engineer's disposition of a flag. */
export const DECISIONS = ["accept", "restress", "detension_restress", "liftoff_check", "replace", "other"] as const;
export type Decision = (typeof DECISIONS)[number];

export const REPORT_KINDS = ["pour_stressing", "daily_inspection"] as const;
export type ReportKind = (typeof REPORT_KINDS)[number];

export const AUDIT_OUTCOMES = ["success", "failure", "denied"] as const;
export type AuditOutcome = (typeof AUDIT_OUTCOMES)[number];

/** What each kind of upload is for. */
export const UPLOAD_PURPOSES = [
  "mill_certificate",
  "calibration_certificate",
  "record_photo",
  "review_photo",
  "lab_report",
] as const;
export type UploadPurpose = (typeof UPLOAD_PURPOSES)[number];

/** Every stored file's purpose: the uploads and the files the server makes itself (a signed report). */
export const ATTACHMENT_PURPOSES = [...UPLOAD_PURPOSES, "signed_report"] as const;
export type AttachmentPurpose = (typeof ATTACHMENT_PURPOSES)[number];
