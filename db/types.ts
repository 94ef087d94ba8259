import type { ColumnType, Generated, Insertable, Selectable, Updateable } from "kysely";

/**
 * The database as Kysely sees it. One interface per table; `Generated<>` marks defaults,
 * `T | null` marks nullable columns. Every value is stored in SI units; where a person typed
 * a value in another unit, the value as entered is kept beside it.
 */

// Optional on insert: every timestamp column has a default or is nullable.
type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type Json<T> = ColumnType<T, string, string>;

export type Role = "crew" | "inspector" | "engineer" | "admin";
export type UnitSystem = "us" | "si";
export type ReadingResolution = "1/8in" | "1/16in" | "1mm";
export type ComparisonBasis = "gross" | "net";
export type PourStatus = "planned" | "stressing" | "released";
export type TendonKind = "unbonded_monostrand" | "bonded_multistrand";
export type StressingEnds = "A" | "B" | "both";

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
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface ProjectsTable {
  id: Generated<string>;
  code: string;
  name: string;
  address: string | null;
  unit_system: Generated<UnitSystem>;
  reading_resolution: Generated<ReadingResolution>;
  tolerance_pct: Generated<number>;
  group_tolerance_pct: number | null;
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
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface ProjectMembersTable {
  project_id: string;
  user_id: string;
  role: Role;
  created_at: Timestamp;
}

export interface PoursTable {
  id: Generated<string>;
  project_id: string;
  name: string;
  level: string | null;
  area_m2: number | null;
  planned_stressing_date: string | null;
  status: Generated<PourStatus>;
  created_at: Timestamp;
  updated_at: Timestamp;
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

export type AuditOutcome = "success" | "failure" | "denied";

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

export interface Database {
  users: UsersTable;
  projects: ProjectsTable;
  project_members: ProjectMembersTable;
  pours: PoursTable;
  strand_lots: StrandLotsTable;
  tendons: TendonsTable;
  verification_tokens: VerificationTokensTable;
  invitations: InvitationsTable;
  password_resets: PasswordResetsTable;
  audit_events: AuditEventsTable;
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
