// Longer than most files: the one Database interface, a table per interface, as Kysely wants it.
import type { ColumnType, Generated, Insertable, Selectable } from 'kysely'
import type { Role } from '../shared/utils/roles'

/** ISO-8601 text timestamps, set by SQLite defaults on insert. */
type CreatedAt = ColumnType<string, string | undefined, never>

export interface UsersTable {
  id: Generated<number>
  email: string
  name: string
  password_hash: string
  created_at: CreatedAt
  /** When the person proved the address is theirs (a link from a verification, reset or invitation e-mail); null until then. */
  email_verified_at: ColumnType<string | null, string | null | undefined, string | null>
  /** The organisation the person last chose; the app opens it by default. */
  last_org_id: ColumnType<number | null, number | null | undefined, number | null>
}

export interface OrganisationsTable {
  id: Generated<number>
  name: string
  /** ISO 4217 code of the currency the organisation's money figures are in (no conversion). */
  currency_code: Generated<string>
  /** Symbol shown beside its amounts. */
  currency_symbol: Generated<string>
  created_at: CreatedAt
}

export interface MembershipsTable {
  user_id: number
  org_id: number
  role: Role
  created_at: CreatedAt
}

export interface AuditLogTable {
  id: Generated<number>
  org_id: number | null
  user_id: number | null
  action: string
  target_type: string | null
  target_id: number | null
  /** JSON text with the details worth keeping (never passwords). */
  detail: string | null
  created_at: CreatedAt
}

/** A signed-in browser: the sealed cookie carries a random key whose hash is here (migration 0005). */
export interface SessionsTable {
  id: Generated<number>
  user_id: number
  key_hash: string
  created_at: CreatedAt
  last_seen_at: ColumnType<string, string | undefined, string>
  user_agent: ColumnType<string, string | undefined, string>
}

export interface EmailVerificationsTable {
  id: Generated<number>
  user_id: number
  /** The address the link proves; a link for an address the account no longer has does nothing. */
  email: string
  token_hash: string
  created_at: CreatedAt
  expires_at: string
  used_at: string | null
}

/** One counted attempt for the throttles (server/domain/throttle.ts). */
export interface ThrottleHitsTable {
  id: Generated<number>
  bucket: string
  key: string
  /** Unix time in milliseconds. */
  at: number
}

export interface SitesTable {
  id: Generated<number>
  org_id: number
  name: string
  river_name: string
  lat: number
  lng: number
  altitude_m: number
  gross_head_m: number
  target_oxygen_mgl: number
  /** JSON: GeoJSON LineString, or null. */
  reach: string | null
  /** JSON: { grossHead_m, crestWidth_m, shape, waterQuality }. */
  weir: string
  /** JSON: [{ flow, head }]. */
  head_table: ColumnType<string, string | undefined, string>
  /** JSON: { kind: 'fixed', flow } | { kind: 'percentile', exceedance }. */
  reserved_flow: string
  /** JSON: { preset, maxTake, keptShare_pct, passFlow_m3s } (shared/schemas/flowRules.ts); the hands-off flow is reserved_flow. */
  flow_rules: ColumnType<string, string | undefined, string>
  /** JSON: 12 × { waterTemp_C, upstreamOxygen: { value, unit, measured? }, flow_m3s? } (older rows lack the optional fields). */
  months: string
  /** JSON: { siteArea_km2, gaugeArea_km2 }, or null. */
  catchment: string | null
  /** JSON: [{ exceedance, flow }]. */
  fdc_points: ColumnType<string, string | undefined, string>
  notes: ColumnType<string, string | undefined, string>
  version: ColumnType<number, number | undefined, number>
  created_by: number | null
  created_at: CreatedAt
  updated_at: ColumnType<string, string | undefined, string>
  deleted_at: string | null
  deleted_by: number | null
}

export interface FlowDaysTable {
  site_id: number
  /** YYYY-MM-DD. */
  day: string
  /** Gauged flow as uploaded, m³/s, before scaling; null for a gap. */
  flow: number | null
}

export interface FlowRecordsTable {
  site_id: number
  file_name: string
  uploaded_by: number | null
  uploaded_at: ColumnType<string, string | undefined, string>
  date_column: string
  flow_column: string
  flag_column: string | null
  date_format: 'iso' | 'day-first'
  day_count: number
  gap_count: number
  first_day: string
  last_day: string
  site_area_km2: number | null
  gauge_area_km2: number | null
  scale_factor: number
  q95: number | null
  q50: number | null
  q10: number | null
  mean_flow: number | null
}

export interface AttachmentsTable {
  id: Generated<number>
  site_id: number
  /** Random id the file is kept under in the uploads storage. */
  storage_key: string
  original_name: string
  content_type: string
  size_bytes: number
  uploaded_by: number | null
  created_at: CreatedAt
  deleted_at: string | null
}

export interface OptionsTable {
  id: Generated<number>
  site_id: number
  org_id: number
  name: string
  notes: ColumnType<string, string | undefined, string>
  /** JSON: the engine's option (shared/schemas/assess.ts EngineOptionSchema), defaults filled in. */
  design: string
  /** JSON: the engine settings (SettingsInputSchema), defaults filled in. */
  settings: string
  version: ColumnType<number, number | undefined, number>
  created_by: number | null
  created_at: CreatedAt
  updated_at: ColumnType<string, string | undefined, string>
  deleted_at: string | null
  deleted_by: number | null
}

export interface AssessmentsTable {
  id: Generated<number>
  option_id: number
  site_id: number
  org_id: number
  engine_version: string
  annual_energy_mwh: number
  capacity_factor: number
  rated_power_kw: number
  min_cavitation_margin_m: number | null
  net_oxygen_gain_slf_mgl: number
  lcoe: number | null
  /** Capital cost and NPV at the export price, in the organisation's currency (null only for a stored result that lacked them). */
  capex: number | null
  npv: number | null
  /** The Monte Carlo's annual energy exceeded in half and in nine of ten draws, MWh/yr, and its share of draws whose worst month loses more oxygen than the acceptable loss (null when no draws ran, or stored before engine 0.3.0). */
  energy_p50_mwh: number | null
  energy_p90_mwh: number | null
  net_loss_probability: number | null
  /** The daily record's annual energy exceeded in nine years of ten, MWh (null for an entered curve or under 9 complete years). */
  record_p90_mwh: number | null
  /** Annual energy of the conventional turbine at the same weir, MWh/yr; null for a run stored before it. */
  baseline_energy_mwh: number | null
  /** JSON: ids of the flags raised. */
  flags_raised: string
  flag_count: number
  supersedes_id: number | null
  created_by: number | null
  created_at: CreatedAt
}

/** The bulky part of an assessment, one row each. */
export interface AssessmentPayloadsTable {
  assessment_id: number
  /** JSON: the exact AssessInput the engine ran, defaults filled in. */
  input_json: string
  /** JSON: the whole AssessResult. */
  result_json: string
}

// ——— Review, e-mail, invitations, password reset, summary links (migration 0004) ———

/** Review state names (shared/schemas/review.ts REVIEW_STATES). */
type ReviewStateColumn = 'draft' | 'submitted' | 'accepted' | 'accepted-with-conditions' | 'returned'

/** The current review of a site; a site without a row is in draft. */
export interface SiteReviewsTable {
  site_id: number
  org_id: number
  state: ReviewStateColumn
  assessment_id: number | null
  submitted_by: number | null
  submitted_at: string | null
  decided_by: number | null
  decided_at: string | null
  reason: string | null
  conditions: string | null
  updated_at: ColumnType<string, string | undefined, string>
  /** JSON: the consent kinds the latest decision requires granted (migration 0015). */
  required_consents: ColumnType<string, string | undefined, string>
}

/** Every change of a review: who, from, to, reason, conditions, assessment, when. */
export interface ReviewEventsTable {
  id: Generated<number>
  site_id: number
  org_id: number
  kind: 'submitted' | 'decided'
  from_state: ReviewStateColumn
  to_state: ReviewStateColumn
  user_id: number | null
  assessment_id: number | null
  note: string | null
  reason: string | null
  conditions: string | null
  created_at: CreatedAt
  /** JSON: the consent kinds a decision requires granted (migration 0015). */
  required_consents: ColumnType<string, string | undefined, string>
}

export interface CommentsTable {
  id: Generated<number>
  site_id: number
  org_id: number
  user_id: number | null
  body: string
  assessment_id: number | null
  month: number | null
  flag_id: string | null
  /** JSON: ids of the users mentioned. */
  mentions: ColumnType<string, string | undefined, string>
  created_at: CreatedAt
}

/** A reviewer of one site only, without membership of its organisation. */
export interface SiteGrantsTable {
  user_id: number
  site_id: number
  org_id: number
  role: 'reviewer'
  granted_by: number | null
  created_at: CreatedAt
}

export interface OutboxTable {
  id: Generated<number>
  org_id: number | null
  to_address: string
  subject: string
  text: string
  html: string
  kind: string
  created_at: CreatedAt
  sent_at: string | null
  error: string | null
}

export interface InvitationsTable {
  id: Generated<number>
  org_id: number
  email: string
  role: Role
  site_id: number | null
  /** SHA-256 hex of the token; the token itself is only ever in the e-mail. */
  token_hash: string
  invited_by: number | null
  created_at: CreatedAt
  expires_at: string
  accepted_at: string | null
  accepted_by: number | null
  revoked_at: string | null
  revoked_by: number | null
}

export interface PasswordResetsTable {
  id: Generated<number>
  user_id: number
  token_hash: string
  created_at: CreatedAt
  expires_at: string
  used_at: string | null
}

export interface SummaryLinksTable {
  id: Generated<number>
  site_id: number
  org_id: number
  token_hash: string
  note: string | null
  created_by: number | null
  created_at: CreatedAt
  expires_at: string
  revoked_at: string | null
  revoked_by: number | null
  view_count: ColumnType<number, number | undefined, number>
  last_viewed_at: string | null
}

// ——— Consents and constraints (migration 0015) ———

/** One permission of a site, once someone has saved it; a kind without a row is not started. */
export interface SiteConsentsTable {
  id: Generated<number>
  site_id: number
  org_id: number
  /** shared/utils/consents.ts CONSENT_KINDS. */
  kind: string
  /** shared/utils/consents.ts CONSENT_STATUSES. */
  status: string
  reference: string
  /** YYYY-MM-DD. */
  applied_on: string | null
  decided_on: string | null
  conditions: string
  notes: string
  version: ColumnType<number, number | undefined, number>
  created_by: number | null
  updated_by: number | null
  created_at: CreatedAt
  updated_at: ColumnType<string, string | undefined, string>
}

/** What a site's checks need that is not a permission: the nearest dwelling, its noise limit, a gauging station. */
export interface SiteConstraintsTable {
  site_id: number
  org_id: number
  nearest_dwelling_m: number | null
  /** dB(A); null takes the default limit. */
  noise_limit_dba: number | null
  /** 0 or 1. */
  is_gauging_station: ColumnType<number, number | undefined, number>
  version: ColumnType<number, number | undefined, number>
  updated_by: number | null
  updated_at: ColumnType<string, string | undefined, string>
}

/** Measurements on a built scheme against the assessment they check (migration 0016). */
export interface CommissioningRecordsTable {
  id: Generated<number>
  site_id: number
  org_id: number
  option_id: number | null
  assessment_id: number | null
  measured_at: string
  measured_by: string
  entered_by: number | null
  river_flow_m3s: number
  water_temp_c: number
  manometer_fluid: string
  manometer_density_kgm3: number
  reading_m: number
  reading_unit: string
  upstream_tap_diameter_m: number | null
  discharge_coefficient: number | null
  upstream_oxygen_mgl: number
  downstream_oxygen_mgl: number
  oxygen_measured_at: string
  notes: ColumnType<string, string | undefined, string>
  /** Verdict kinds: as-assessed, below, above, not-comparable. */
  flow_verdict: string
  oxygen_verdict: string
  /** JSON: the whole CommissioningResult (shared/engine/commissioning.ts). */
  result_json: string
  engine_version: string
  created_at: CreatedAt
  deleted_at: string | null
  deleted_by: number | null
}

/** The whole database, as Kysely sees it. */
export interface Database {
  users: UsersTable
  organisations: OrganisationsTable
  memberships: MembershipsTable
  audit_log: AuditLogTable
  sessions: SessionsTable
  email_verifications: EmailVerificationsTable
  throttle_hits: ThrottleHitsTable
  sites: SitesTable
  flow_days: FlowDaysTable
  flow_records: FlowRecordsTable
  attachments: AttachmentsTable
  options: OptionsTable
  assessments: AssessmentsTable
  assessment_payloads: AssessmentPayloadsTable
  site_reviews: SiteReviewsTable
  review_events: ReviewEventsTable
  comments: CommentsTable
  site_grants: SiteGrantsTable
  outbox: OutboxTable
  invitations: InvitationsTable
  password_resets: PasswordResetsTable
  summary_links: SummaryLinksTable
  site_consents: SiteConsentsTable
  site_constraints: SiteConstraintsTable
  commissioning_records: CommissioningRecordsTable
}

export type UserRow = Selectable<UsersTable>
export type NewUser = Insertable<UsersTable>
export type OrganisationRow = Selectable<OrganisationsTable>
export type AuditRow = Selectable<AuditLogTable>
export type SiteRow = Selectable<SitesTable>
export type NewSite = Insertable<SitesTable>
export type FlowRecordRow = Selectable<FlowRecordsTable>
export type AttachmentRow = Selectable<AttachmentsTable>
export type OptionRow = Selectable<OptionsTable>
export type AssessmentRow = Selectable<AssessmentsTable>
export type NewAssessment = Insertable<AssessmentsTable>
export type SiteReviewRow = Selectable<SiteReviewsTable>
export type ReviewEventRow = Selectable<ReviewEventsTable>
export type CommentRow = Selectable<CommentsTable>
export type InvitationRow = Selectable<InvitationsTable>
export type SummaryLinkRow = Selectable<SummaryLinksTable>
export type OutboxRow = Selectable<OutboxTable>
export type SiteConsentRow = Selectable<SiteConsentsTable>
export type SiteConstraintsRow = Selectable<SiteConstraintsTable>
export type CommissioningRecordRow = Selectable<CommissioningRecordsTable>
