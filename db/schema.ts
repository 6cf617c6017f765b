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
}

export interface OrganisationsTable {
  id: Generated<number>
  name: string
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

export interface SignInFailuresTable {
  id: Generated<number>
  email: string
  /** Unix time in milliseconds of the failed attempt. */
  failed_at: number
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
  /** JSON: { grossHeadM, crestWidthM, shape, waterQuality }. */
  weir: string
  /** JSON: [{ flow, head }]. */
  head_table: ColumnType<string, string | undefined, string>
  /** JSON: { kind: 'fixed', flow } | { kind: 'percentile', exceedance }. */
  reserved_flow: string
  /** JSON: 12 × { waterTempC, upstreamOxygen: { value, unit } }. */
  months: string
  /** JSON: { siteAreaKm2, gaugeAreaKm2 }, or null. */
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
  /** JSON: the engine's option (shared/schemas/assess.ts OptionInputSchema), defaults filled in. */
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

/** The whole database, as Kysely sees it. */
export interface Database {
  users: UsersTable
  organisations: OrganisationsTable
  memberships: MembershipsTable
  audit_log: AuditLogTable
  sign_in_failures: SignInFailuresTable
  sites: SitesTable
  flow_days: FlowDaysTable
  flow_records: FlowRecordsTable
  attachments: AttachmentsTable
  options: OptionsTable
  assessments: AssessmentsTable
  assessment_payloads: AssessmentPayloadsTable
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
