import { AuditQuerySchema, boundary } from '../../../../shared/schemas/admin'
import { OrgParamsSchema } from '../../../../shared/schemas/common'

// The organisation's audit trail, newest first, paged; admins only. Filters: `action` (exact, or a
// prefix ending in a dot such as `review.`), `userId`, `targetType`, `from` and `to` (inclusive; a
// bare day covers the whole day, UTC).
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, ['admin'])
  const { page, pageSize, action, userId, targetType, from, to } = await getValidatedQuery(event, validator(AuditQuerySchema, 'query'))
  const db = useDb()
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
  return {
    page,
    pageSize,
    total: Number(total.n),
    entries: rows.map((r) => ({ ...r, detail: r.detail ? (JSON.parse(r.detail) as Record<string, unknown>) : null })),
  }
})
