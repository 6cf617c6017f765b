// Administration lists: the local outbox of e-mails and the filters of the audit trail. Shared by
// server/api/orgs/[orgId]/outbox.get.ts, server/api/orgs/[orgId]/audit.get.ts and the admin page.
// Keep the exported names stable: the UI imports them.
import { z } from 'zod'
import { IdSchema, fromDigits } from './common'

/** What each e-mail Gillwatt sends is about. */
export const MAIL_KINDS = ['invitation', 'review-submitted', 'review-decided', 'comment-mention', 'password-reset', 'verify-email', 'signup-exists'] as const
export type MailKind = (typeof MAIL_KINDS)[number]

export const MAIL_KIND_LABELS: Record<MailKind, string> = {
  invitation: 'Invitation',
  'review-submitted': 'Review submitted',
  'review-decided': 'Review decision',
  'comment-mention': 'Mentioned in a comment',
  'password-reset': 'Password reset',
  'verify-email': 'Address confirmation',
  'signup-exists': 'Sign-up with a taken address',
}

const page = {
  page: fromDigits(z.number().int().min(1, 'must be 1 or more')).default(1),
  pageSize: fromDigits(z.number().int().min(1, 'must be 1 or more').max(200, 'must be 200 or less')).default(50),
}

/** Query of GET /api/orgs/[orgId]/outbox: newest first. */
export const OutboxQuerySchema = z.object({
  kind: z.enum(MAIL_KINDS, { error: `must be one of ${MAIL_KINDS.join(', ')}` }).optional(),
  ...page,
})

/** One e-mail in the outbox. `sentAt`/`error` are set only when an SMTP server is configured. */
export interface OutboxEntryDto {
  id: number
  to: string
  subject: string
  text: string
  html: string
  kind: MailKind
  createdAt: string
  sentAt: string | null
  error: string | null
}

/** GET /api/orgs/[orgId]/outbox. */
export interface OutboxListDto {
  page: number
  pageSize: number
  total: number
  /** True when SMTP_URL is set (mail also leaves the server). */
  smtpConfigured: boolean
  messages: OutboxEntryDto[]
}

// A day (YYYY-MM-DD, the whole day) or a full ISO time.
const DAY_OR_TIME = /^\d{4}-\d{2}-\d{2}(T\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?(Z|[+-]\d{2}:\d{2})?)?$/
const when = z
  .string({ error: 'must be a date' })
  .trim()
  .regex(DAY_OR_TIME, 'must be a date like 2026-03-01 or an ISO time')
  .refine((s) => realDay(s.slice(0, 10)) && !Number.isNaN(Date.parse(s)), 'is not a real date')

/** True when YYYY-MM-DD names a day that exists (no 30 February). */
function realDay(day: string): boolean {
  const [y, m, d] = day.split('-').map(Number) as [number, number, number]
  const t = new Date(Date.UTC(y, m - 1, d))
  return t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d
}

/** Query of GET /api/orgs/[orgId]/audit: newest first, with optional filters. */
export const AuditQuerySchema = z
  .object({
    /** Exact action (`review.submitted`) or a prefix ending in a dot (`review.`). */
    action: z.string({ error: 'must be text' }).trim().min(1, 'is empty').max(100, 'is too long').regex(/^[a-z0-9.-]+$/, 'may hold only a-z, 0-9, dots and dashes').optional(),
    userId: IdSchema.optional(),
    targetType: z.string({ error: 'must be text' }).trim().min(1, 'is empty').max(50, 'is too long').regex(/^[a-z0-9_-]+$/, 'may hold only a-z, 0-9, _ and -').optional(),
    /** Inclusive; a day means from its start (UTC). */
    from: when.optional(),
    /** Inclusive; a day means to its end (UTC). */
    to: when.optional(),
    ...page,
  })
  .refine((q) => !q.from || !q.to || !realDay(q.from.slice(0, 10)) || !realDay(q.to.slice(0, 10)) || boundary(q.from, 'from') <= boundary(q.to, 'to'), { path: ['to'], message: 'must not be before from' })
export type AuditQuery = z.infer<typeof AuditQuerySchema>

/** The ISO instant a from/to filter stands for (a bare day widens to its start or end, UTC). */
export function boundary(value: string, side: 'from' | 'to'): string {
  if (/^\d{4}-\d{2}-\d{2}$/.test(value)) return side === 'from' ? `${value}T00:00:00.000Z` : `${value}T23:59:59.999Z`
  const t = Date.parse(value)
  return Number.isNaN(t) ? value : new Date(t).toISOString()
}
