import { OrgParamsSchema, PageQuerySchema } from '../../../../shared/schemas/common'

// The organisation's audit trail, newest first, paged; admins only.
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, ['admin'])
  const { page, pageSize } = await getValidatedQuery(event, validator(PageQuerySchema, 'query'))
  const db = useDb()
  const [rows, total] = await Promise.all([
    db
      .selectFrom('audit_log')
      .leftJoin('users', 'users.id', 'audit_log.user_id')
      .select(['audit_log.id', 'audit_log.action', 'audit_log.target_type as targetType', 'audit_log.target_id as targetId', 'audit_log.detail', 'audit_log.created_at as at', 'users.name as userName'])
      .where('audit_log.org_id', '=', orgId)
      .orderBy('audit_log.id', 'desc')
      .limit(pageSize)
      .offset((page - 1) * pageSize)
      .execute(),
    db.selectFrom('audit_log').select((eb) => eb.fn.countAll<number>().as('n')).where('org_id', '=', orgId).executeTakeFirstOrThrow(),
  ])
  return {
    page,
    pageSize,
    total: Number(total.n),
    entries: rows.map((r) => ({ ...r, detail: r.detail ? (JSON.parse(r.detail) as Record<string, unknown>) : null })),
  }
})
