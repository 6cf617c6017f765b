import { listAuditEntries } from '~~/server/domain/audit'
import { AuditQuerySchema } from '#shared/schemas/admin'
import { OrgParamsSchema } from '#shared/schemas/common'

// The organisation's audit trail, newest first, paged; admins only. Filters: `action` (exact, or a
// prefix ending in a dot such as `review.`), `userId`, `targetType`, `from` and `to` (inclusive; a
// bare day covers the whole day, UTC).
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, ['admin'])
  const query = await getValidatedQuery(event, validator(AuditQuerySchema, 'query'))
  const { total, entries } = await listAuditEntries(useDb(), orgId, query)
  return { page: query.page, pageSize: query.pageSize, total, entries }
})
