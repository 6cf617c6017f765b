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

/** The whole database, as Kysely sees it. */
export interface Database {
  users: UsersTable
  organisations: OrganisationsTable
  memberships: MembershipsTable
  audit_log: AuditLogTable
  sign_in_failures: SignInFailuresTable
}

export type UserRow = Selectable<UsersTable>
export type NewUser = Insertable<UsersTable>
export type OrganisationRow = Selectable<OrganisationsTable>
export type AuditRow = Selectable<AuditLogTable>
