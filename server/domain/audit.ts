import type { Kysely } from 'kysely'
import type { Database } from '../../db/schema'
import { boundary, type AuditQuery } from '../../shared/schemas/admin'

// The audit trail: one line per change (who, what, on which record, the details worth keeping), and
// an organisation's trail as its admins page through it.

/** One line of the audit trail. Actions are `noun.verb-ed`; `detail` never holds secrets. */
export interface AuditEntry {
  orgId: number | null
  userId: number | null
  action: string
  targetType?: string
  targetId?: number
  detail?: Record<string, unknown>
  /** When it happened; the database's clock when left out (the seed backdates its demo). */
  at?: string
}

/** An audit line as admins see it. */
export interface AuditEntryDto {
  id: number
  action: string
  userId: number | null
  userName: string | null
  targetType: string | null
  targetId: number | null
  detail: Record<string, unknown> | null
  at: string
}

/** Appends one line to the audit trail. */
export async function recordAudit(db: Kysely<Database>, entry: AuditEntry): Promise<void> {
  await db
    .insertInto('audit_log')
    .values({
      org_id: entry.orgId,
      user_id: entry.userId,
      action: entry.action,
      target_type: entry.targetType ?? null,
      target_id: entry.targetId ?? null,
      detail: entry.detail ? JSON.stringify(entry.detail) : null,
      ...(entry.at ? { created_at: entry.at } : {}),
    })
    .execute()
}

/**
 * One page of an organisation's audit trail, newest first, with the total. `action` is exact, or a
 * prefix when it ends in a dot (`review.`); `from` and `to` are inclusive (a bare day is the whole day, UTC).
 */
export async function listAuditEntries(db: Kysely<Database>, orgId: number, query: AuditQuery): Promise<{ total: number; entries: AuditEntryDto[] }> {
  const { page, pageSize, action, userId, targetType, from, to } = query
  let q = db.selectFrom('audit_log').where('audit_log.org_id', '=', orgId)
  if (action) q = action.endsWith('.') ? q.where('audit_log.action', 'like', `${action}%`) : q.where('audit_log.action', '=', action)
  if (userId) q = q.where('audit_log.user_id', '=', userId)
  if (targetType) q = q.where('audit_log.target_type', '=', targetType)
  if (from) q = q.where('audit_log.created_at', '>=', boundary(from, 'from'))
  if (to) q = q.where('audit_log.created_at', '<=', boundary(to, 'to'))
  const [rows, total] = await Promise.all([
    q
      .leftJoin('users', 'users.id', 'audit_log.user_id')
      .select(['audit_log.id', 'audit_log.action', 'audit_log.user_id as userId', 'audit_log.target_type as targetType', 'audit_log.target_id as targetId', 'audit_log.detail', 'audit_log.created_at as at', 'users.name as userName'])
      .orderBy('audit_log.id', 'desc')
      .limit(pageSize)
      .offset((page - 1) * pageSize)
      .execute(),
    q.select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  return { total: Number(total.n), entries: rows.map((r) => ({ ...r, detail: r.detail ? (JSON.parse(r.detail) as Record<string, unknown>) : null })) }
}
