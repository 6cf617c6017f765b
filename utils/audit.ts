// The audit trail's search: the filters as a form holds them, their query string, the hints offered,
// and an entry's before/after details as rows.
import type { AuditQuery } from '#shared/schemas/admin'

export interface AuditEntry {
  id: number
  action: string
  targetType: string | null
  targetId: number | null
  detail: Record<string, unknown> | null
  at: string
  userName: string | null
}

/** The audit filters as a form holds them (empty string: no filter). */
export interface AuditFilters {
  action: string
  userId: number | ''
  targetType: string
  from: string
  to: string
}

export const EMPTY_AUDIT_FILTERS: Readonly<AuditFilters> = { action: '', userId: '', targetType: '', from: '', to: '' }

/** The query string of the filters: blanks left out, text trimmed. */
export function auditQuery(f: AuditFilters, page: number): Partial<AuditQuery> & { page: number; pageSize: number } {
  const q: Partial<AuditQuery> & { page: number; pageSize: number } = { page, pageSize: 25 }
  if (f.action.trim()) q.action = f.action.trim()
  if (f.userId !== '') q.userId = f.userId
  if (f.targetType.trim()) q.targetType = f.targetType.trim()
  if (f.from) q.from = f.from
  if (f.to) q.to = f.to
  return q
}

/** Action prefixes offered in the filter (a prefix ends in a dot and matches every action under it). */
export const AUDIT_ACTION_HINTS = [
  'member.', 'invitation.', 'site-grant.', 'review.', 'comment.', 'summary-link.', 'site.', 'option.', 'assessment.', 'attachment.', 'flow-record.', 'organisation.',
] as const

/** Target types offered in the filter. */
export const AUDIT_TARGET_HINTS = ['site', 'option', 'assessment', 'attachment', 'user', 'organisation', 'invitation', 'summary_link', 'commissioning'] as const

/** One line of an entry's details: a field, and its value before and after where the entry has both. */
export interface AuditDetailRow {
  key: string
  before?: string
  after?: string
  value?: string
}

const show = (v: unknown): string => {
  if (v === null || v === undefined) return '—'
  if (typeof v === 'string') return v
  if (typeof v === 'number' || typeof v === 'boolean') return String(v)
  if (Array.isArray(v)) return v.map(show).join(', ')
  return JSON.stringify(v)
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v)

/**
 * An entry's details as rows. `{ before: {...}, after: {...} }` gives one row per field that either
 * side holds (a creation, `before: null`, just lists the new values); `{ from, to }` gives one
 * "change" row; other fields are shown as they are.
 */
export function auditDetailRows(detail: Record<string, unknown> | null): AuditDetailRow[] {
  if (!detail) return []
  const rows: AuditDetailRow[] = []
  const { before, after, from, to, ...rest } = detail
  if (before === null && isRecord(after)) {
    // A creation: nothing came before, so the new values are simply listed.
    for (const [key, v] of Object.entries(after)) rows.push({ key, value: show(v) })
  } else if (before !== undefined || after !== undefined) {
    if (isRecord(before) || isRecord(after)) {
      const b = isRecord(before) ? before : {}
      const a = isRecord(after) ? after : {}
      for (const key of [...new Set([...Object.keys(b), ...Object.keys(a)])]) rows.push({ key, before: show(b[key]), after: show(a[key]) })
    } else rows.push({ key: 'value', before: show(before), after: show(after) })
  }
  if (from !== undefined || to !== undefined) rows.push({ key: 'change', before: show(from), after: show(to) })
  for (const [key, v] of Object.entries(rest)) rows.push({ key, value: show(v) })
  return rows
}
