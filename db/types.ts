import type { ColumnType, Generated, Insertable, Selectable, Updateable } from "kysely";
import type {
  AttachmentPurpose,
  AuditOutcome,
  ComparisonBasis,
  ConcreteSpecimen,
  Decision,
  FlagKind,
  FlagMailMode,
  FlagStatus,
  GoverningValue,
  PourStatus,
  ReadingMethod,
  Releaser,
  ReportKind,
  ReviewKind,
  Role,
  StoredResolution,
  StressingEnds,
  StressingOrder,
  TendonEnd,
  TendonKind,
  UnitSystem,
  Verdict,
} from "@/lib/schemas/domain";

/**
 * The database as Kysely sees it. One interface per table; `Generated<>` marks defaults,
 * `T | null` marks nullable columns. Every value is stored in SI units; where a person typed
 * a value in another unit, the value as entered is kept beside it. The closed sets of words
 * (roles, verdicts, flag kinds …) are the domain's own, from `lib/schemas/domain.ts`.
 */

// Optional on insert: every timestamp column has a default or is nullable.
type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type Json<T> = ColumnType<T, string, string>;

export interface TendonSegment {
  lengthMm: number;
  angleRad: number;
}

export interface UsersTable {
  id: Generated<string>;
  email: string;
  name: string;
  password_hash: string | null;
  email_verified: Date | null;
  is_operator: Generated<boolean>;
  is_active: Generated<boolean>;
  session_version: Generated<number>;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface ProjectsTable {
  id: Generated<string>;
  code: string;
  name: string;
  address: string | null;
  unit_system: Generated<UnitSystem>;
  reading_resolution: Generated<StoredResolution>;
  tolerance_pct: Generated<number>;
  group_tolerance_pct: number | null;
  /** Steel lost to unreplaced wire breaks that a member may carry, % of its prestressing steel (default 2). */
  wire_loss_limit_pct: Generated<number>;
  short_tendon_floor_mm: number | null;
  comparison_basis: Generated<ComparisonBasis>;
  count_jack_grip: Generated<boolean>;
  friction_mu: Generated<number>;
  wobble_per_m: Generated<number>;
  anchor_set_mm: Generated<number>;
  calibration_validity_days: Generated<number>;
  required_concrete_mpa: number | null;
  engineer_of_record_name: string | null;
  engineer_of_record_email: string | null;
  notify_emails: Generated<string[]>;
  blind_entry: Generated<boolean>;
  release_by: Generated<Releaser>;
  time_zone: Generated<string>;
  jacking_force_factor: Generated<number>;
  under_force_pct: Generated<number>;
  seating_excess_mm: Generated<number>;
  clock_skew_minutes: Generated<number>;
  /** Lift-off checks: the band on the lift-off force against the expected anchor force, ± %. */
  liftoff_band_pct: Generated<number>;
  /** When the project's shifts end, minutes after local midnight (default [1080], 18:00). */
  shift_end_minutes: Generated<number[]>;
  governing_value: Generated<GoverningValue>;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface ProjectMembersTable {
  project_id: string;
  user_id: string;
  role: Role;
  created_at: Timestamp;
  /** Flag e-mails one per flag ("each") or one digest per shift ("digest"). */
  flag_mail: Generated<FlagMailMode>;
  /** Where the member's next shift digest begins; set while flag_mail is "digest". */
  digest_from: Timestamp | null;
}

export interface GaugeDriftScansTable {
  pour_id: string;
  project_id: string;
  /** The latest evaluation of the pour already looked at for a drifting gauge. */
  scanned_through: Timestamp;
}

export interface PoursTable {
  id: Generated<string>;
  project_id: string;
  name: string;
  level: string | null;
  area_m2: number | null;
  planned_stressing_date: string | null;
  concrete_strength_mpa: number | null;
  concrete_confirmed_by: string | null;
  concrete_confirmed_at: Timestamp | null;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface ConcreteResultsTable {
  id: Generated<string>;
  project_id: string;
  pour_id: string;
  specimen: ConcreteSpecimen;
  strength_mpa: number;
  age_days: number;
  specimen_count: number;
  attachment_id: string | null;
  entered_by: string;
  entered_at: Timestamp;
}

export interface StrandLotsTable {
  id: Generated<string>;
  project_id: string;
  lot_number: string;
  strand_size: string;
  area_mm2: number;
  modulus_mpa: number;
  breaking_load_n: number;
  certificate_attachment_id: string | null;
  created_at: Timestamp;
}

export interface TendonsTable {
  id: Generated<string>;
  project_id: string;
  pour_id: string;
  tag: string;
  kind: TendonKind;
  strand_size: string;
  strand_count: number;
  segments: Json<TendonSegment[]>;
  ends: StressingEnds;
  jack_grip_mm: number | null;
  shop_elongation_mm: number | null;
  strand_lot_id: string | null;
  /** The member (beam, slab strip, band) the schedule puts the tendon in; null: the pour is its group. */
  member: Generated<string | null>;
  /** How the schedule says a two-end tendon is stressed; null when it does not say. */
  stressing_order: Generated<StressingOrder | null>;
  /** The schedule's specified jacking force, N; null: the project's factor of fpu·A. */
  jacking_force_n: Generated<number | null>;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface VerificationTokensTable {
  identifier: string;
  token: string;
  expires: Date;
}

export interface InvitationsTable {
  id: Generated<string>;
  project_id: string;
  email: string;
  role: Role;
  token_hash: string;
  invited_by: string | null;
  expires_at: Timestamp;
  accepted_at: Timestamp | null;
  revoked_at: Timestamp | null;
  sent_count: Generated<number>;
  created_at: Timestamp;
}

export interface PasswordResetsTable {
  id: Generated<string>;
  user_id: string;
  token_hash: string;
  expires_at: Timestamp;
  used_at: Timestamp | null;
  created_at: Timestamp;
}

export interface AuditEventsTable {
  id: Generated<string>;
  at: Timestamp;
  action: string;
  outcome: AuditOutcome;
  actor_user_id: string | null;
  actor_email: string | null;
  project_id: string | null;
  target: string | null;
  ip: string | null;
  detail: ColumnType<Record<string, unknown>, string | undefined, string>;
}

export interface AttachmentsTable {
  id: Generated<string>;
  project_id: string;
  purpose: AttachmentPurpose;
  object_key: string;
  content_type: string;
  size_bytes: number;
  sha256: string | null;
  original_name: string | null;
  status: Generated<"pending" | "stored">;
  record_id: string | null;
  uploaded_by: string | null;
  created_at: Timestamp;
}

export interface EquipmentSetsTable {
  id: Generated<string>;
  project_id: string;
  name: string;
  jack_serial: string;
  gauge_serial: string;
  pump_serial: string | null;
  jack_grip_mm: number | null;
  max_force_n: number | null;
  /** Wedge draw-in lost at each re-grip between strokes; a ram-travel record without its own uses it. */
  draw_in_mm: number | null;
  created_at: Timestamp;
}

export interface CalibrationPoint {
  pressureMPa: number;
  forceN: number;
}

export interface CalibrationsTable {
  id: Generated<string>;
  project_id: string;
  equipment_set_id: string;
  calibrated_on: string;
  valid_until: string;
  points: Json<CalibrationPoint[]>;
  slope_n_per_mpa: number;
  intercept_n: number;
  r2: number;
  min_pressure_mpa: number;
  max_pressure_mpa: number;
  laboratory: string | null;
  certificate_attachment_id: string | null;
  /** Retired calibrations are never picked again; a correction also names its replacement. */
  retired_at: Timestamp | null;
  retired_reason: string | null;
  retired_by: string | null;
  replaced_by: string | null;
  created_at: Timestamp;
}

export interface RecordsTable {
  id: string;
  project_id: string;
  pour_id: string;
  tendon_id: string;
  tendon_end: TendonEnd;
  chain_id: string;
  revision: number;
  base_record_id: string | null;
  revision_reason: string | null;
  equipment_set_id: string;
  calibration_id: string | null;
  expired_calibration_reason: string | null;
  /** The crew's reason to stress while the pour's concrete strength was not confirmed. */
  concrete_go_ahead: Generated<string | null>;
  initial_pressure_mpa: number | null;
  final_pressure_mpa: number;
  reading_method: ReadingMethod;
  entered: Json<Record<string, unknown>>;
  measured_mm: number;
  seating_mm: number | null;
  stressing_order: StressingOrder | null;
  draw_in_mm: number | null;
  /** The first, coarser reading when the elongation was read again finer (measured_mm is the re-read). */
  first_reading_mm: Generated<number | null>;
  /** Why the finer second reading the tablet asked for could not be taken. */
  reread_declined_reason: Generated<string | null>;
  /** One entry per broken wire: the strand's number (null when not known) and where it broke. */
  wire_break_details: ColumnType<{ strand: number | null; where: string }[] | null, string | null, string | null>;
  wire_breaks: Generated<number>;
  remarks: string | null;
  device_time: Timestamp;
  device_time_zone: string;
  device_id: string;
  author_user_id: string;
  restress_of_disposition_id: string | null;
  received_at: Timestamp;
}

export interface EvaluationsTable {
  id: Generated<string>;
  project_id: string;
  tendon_id: string;
  record_ids: string[];
  reason: string;
  engine_version: string;
  inputs: Json<Record<string, unknown>>;
  result: Json<Record<string, unknown>>;
  verdict: Verdict;
  provisional: boolean;
  deviation_pct: number | null;
  predicted_mm: number | null;
  measured_mm: number | null;
  created_at: Timestamp;
}

export interface FlagsTable {
  id: Generated<string>;
  project_id: string;
  pour_id: string;
  tendon_id: string;
  record_id: string | null;
  evaluation_id: string | null;
  kind: FlagKind;
  reason: string;
  status: Generated<FlagStatus>;
  closed_at: Timestamp | null;
  closed_by: string | null;
  close_reason: string | null;
  created_at: Timestamp;
  /** The flag's number in its project ("F-0012"), given by a trigger at insert, never changed. */
  number: Generated<number>;
}

export interface ReviewsTable {
  id: Generated<string>;
  project_id: string;
  flag_id: string;
  author_user_id: string;
  kind: ReviewKind;
  body: string;
  remeasured_mm: number | null;
  attachment_id: string | null;
  created_at: Timestamp;
}

export interface DispositionsTable {
  id: Generated<string>;
  project_id: string;
  flag_id: string;
  tendon_id: string;
  decision: Decision;
  reasons: string;
  engineer_user_id: string;
  engineer_name: string;
  licence_statement: string;
  created_at: Timestamp;
  /** The disposition's number in its project ("D-0007"), given by a trigger at insert, never changed. */
  number: Generated<number>;
}

export interface ReleasesTable {
  id: Generated<string>;
  project_id: string;
  pour_id: string;
  released_by: string;
  released_by_name: string;
  statement: string;
  /** The name the engineer typed to sign the release (null on releases signed before signatures). */
  signer_name: string | null;
  licence: string | null;
  /** sha256 of the pour's stressing report content at signing. */
  content_sha256: string | null;
  created_at: Timestamp;
}

export interface PourReopeningsTable {
  id: Generated<string>;
  project_id: string;
  pour_id: string;
  release_id: string;
  reopened_by: string;
  reopened_by_name: string;
  reason: string;
  created_at: Generated<Date>;
}

/** A view: each pour's derived status, its standing release and its last reopening. */
export interface PourStatesView {
  pour_id: string;
  project_id: string;
  status: PourStatus;
  release_id: string | null;
  released_by_name: string | null;
  released_at: Date | null;
  release_statement: string | null;
  last_reopened_by_name: string | null;
  last_reopened_at: Date | null;
  last_reopen_reason: string | null;
}

export interface NotificationsTable {
  id: Generated<string>;
  project_id: string;
  flag_id: string | null;
  dedupe_key: string;
  to_emails: string[];
  subject: string;
  text_body: string;
  html_body: string;
  status: Generated<"pending" | "sent" | "failed">;
  attempts: Generated<number>;
  next_attempt_at: Timestamp;
  last_error: string | null;
  sent_at: Timestamp | null;
  created_at: Timestamp;
}

export interface AppliedOpsTable {
  op_id: string;
  project_id: string;
  device_id: string;
  user_id: string;
  kind: string;
  record_id: string | null;
  status: "applied" | "conflict" | "rejected";
  result: ColumnType<Record<string, unknown>, string | undefined, string>;
  applied_at: Timestamp;
}

/** The version of a tendon's stored records, raised by each write that evaluates it. */
export interface TendonVersionsTable {
  tendon_id: string;
  version: number;
}

/** A deleted row the tablets may hold; change_xid (xid8) is read as text. */
export interface SyncTombstonesTable {
  id: Generated<number>;
  project_id: string;
  table_name: string;
  row_id: string;
  pour_id: string | null;
  change_xid: Generated<string>;
  deleted_at: Timestamp;
}

export interface ReportRevisionsTable {
  id: Generated<string>;
  project_id: string;
  pour_id: string | null;
  kind: ReportKind;
  report_day: string | null;
  revision: number;
  content_sha256: string;
  file_sha256: string;
  snapshot: Json<Record<string, string>>;
  changes: Json<string[]>;
  attachment_id: string;
  signer_user_id: string;
  signer_name: string;
  licence: string;
  statement: string;
  signed_at: Timestamp;
  /** What the inspector attested on a daily report (lib/schemas/daily-report.ts DailyAttestation); null otherwise. */
  attestation: ColumnType<Record<string, unknown> | null, string | undefined, string>;
}

export interface ShareLinksTable {
  id: Generated<string>;
  project_id: string;
  token_sha256: string;
  label: string;
  created_by: string;
  created_at: Timestamp;
  expires_at: Timestamp;
  revoked_at: Timestamp | null;
  revoked_by: string | null;
}

export interface WorkerHeartbeatsTable {
  worker: string;
  beat_at: Timestamp;
  last_error: string | null;
  last_error_at: Date | null;
}

/** Tails cut on a tendon (one per tendon, never changed); held_reasons is set when it came while held. */
export interface TailCutsTable {
  id: string;
  project_id: string;
  pour_id: string;
  tendon_id: string;
  cut_by: string;
  cut_at: Timestamp;
  device_id: string;
  held_reasons: Generated<string[]>;
  received_at: Generated<Timestamp>;
  change_xid: Generated<string>;
}

/** A lift-off check ordered by a disposition, as the server judged it (never changed). */
export interface LiftoffChecksTable {
  id: string;
  project_id: string;
  pour_id: string;
  tendon_id: string;
  disposition_id: string;
  tendon_end: TendonEnd;
  equipment_set_id: string;
  calibration_id: string;
  /** The pressure exactly as typed, with the unit a bare number was read in. */
  entered: Json<{ pressure: string; unit: "psi" | "MPa" }>;
  pressure_mpa: number;
  liftoff_force_n: number;
  expected_force_n: number;
  deviation_pct: number;
  band_pct: number;
  within_band: boolean;
  raised_flag_id: string | null;
  checked_by: string;
  checked_at: Timestamp;
  device_id: string;
  received_at: Generated<Timestamp>;
  change_xid: Generated<string>;
}

/** A detension ordered by a disposition (decision detension_restress), as the crew reported it (never changed). */
export interface DetensionsTable {
  id: string;
  project_id: string;
  pour_id: string;
  tendon_id: string;
  disposition_id: string;
  equipment_set_id: string;
  operator_name: string;
  /** The gauge pressure at release exactly as typed, with the unit a bare number was read in; null when not read. */
  entered: ColumnType<{ pressure: string; unit: "psi" | "MPa" } | null, string | null, string | null>;
  release_pressure_mpa: number | null;
  strands_detensioned: number;
  remarks: string | null;
  detensioned_at: Timestamp;
  recorded_by: string;
  device_id: string;
  received_at: Generated<Timestamp>;
  change_xid: Generated<string>;
}

export interface Database {
  users: UsersTable;
  projects: ProjectsTable;
  project_members: ProjectMembersTable;
  pours: PoursTable;
  concrete_results: ConcreteResultsTable;
  strand_lots: StrandLotsTable;
  tendons: TendonsTable;
  verification_tokens: VerificationTokensTable;
  invitations: InvitationsTable;
  password_resets: PasswordResetsTable;
  audit_events: AuditEventsTable;
  attachments: AttachmentsTable;
  equipment_sets: EquipmentSetsTable;
  calibrations: CalibrationsTable;
  records: RecordsTable;
  evaluations: EvaluationsTable;
  flags: FlagsTable;
  reviews: ReviewsTable;
  dispositions: DispositionsTable;
  releases: ReleasesTable;
  pour_reopenings: PourReopeningsTable;
  pour_states: PourStatesView;
  notifications: NotificationsTable;
  applied_ops: AppliedOpsTable;
  sync_tombstones: SyncTombstonesTable;
  tendon_versions: TendonVersionsTable;
  report_revisions: ReportRevisionsTable;
  share_links: ShareLinksTable;
  worker_heartbeats: WorkerHeartbeatsTable;
  tail_cuts: TailCutsTable;
  liftoff_checks: LiftoffChecksTable;
  detensions: DetensionsTable;
  gauge_drift_scans: GaugeDriftScansTable;
}

export type User = Selectable<UsersTable>;
export type NewUser = Insertable<UsersTable>;
export type Project = Selectable<ProjectsTable>;
export type NewProject = Insertable<ProjectsTable>;
export type ProjectUpdate = Updateable<ProjectsTable>;
export type Pour = Selectable<PoursTable>;
export type NewPour = Insertable<PoursTable>;
export type Tendon = Selectable<TendonsTable>;
export type NewTendon = Insertable<TendonsTable>;
export type StrandLot = Selectable<StrandLotsTable>;
