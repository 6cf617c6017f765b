import { OrgParamsSchema } from '../../../../shared/schemas/common'
import { PORTFOLIO_MAP_MAX, PortfolioQuerySchema, type PortfolioDto } from '../../../../shared/schemas/option'
import { READER_ROLES } from '../../../../shared/utils/roles'

// The organisation's live sites with the headline figures of each one's latest assessment and its
// location for the map: paged, sorted by an allow-listed column (sites never assessed sort last),
// filtered by text, river, whether assessed and review state. `format=csv` downloads every matching
// row; `format=map` answers every matching row (bounded by PORTFOLIO_MAP_MAX) unpaged, for the map.
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, READER_ROLES)
  const { format, ...query } = await getValidatedQuery(event, validator(PortfolioQuerySchema, 'query'))
  const db = useDb()
  if (format === 'csv') {
    const rows = (await portfolioQuery(db, orgId, query, false).execute()).map(portfolioRow)
    setResponseHeader(event, 'Content-Type', 'text/csv; charset=utf-8')
    setResponseHeader(event, 'Content-Disposition', `attachment; filename="gillwatt-portfolio-${orgId}.csv"`)
    return portfolioCsv(rows)
  }
  if (format === 'map') {
    const rows = await portfolioQuery(db, orgId, { ...query, page: 1, pageSize: PORTFOLIO_MAP_MAX }).execute()
    const total = rows.length > 0 ? Number(rows[0]!.total) : 0
    return { page: 1, pageSize: PORTFOLIO_MAP_MAX, total, sort: query.sort, dir: query.dir, rows: rows.map(portfolioRow) } satisfies PortfolioDto
  }
  const rows = await portfolioQuery(db, orgId, query).execute()
  const total = rows.length > 0 ? Number(rows[0]!.total) : query.page > 1 ? await portfolioCount(db, orgId, query) : 0
  return { page: query.page, pageSize: query.pageSize, total, sort: query.sort, dir: query.dir, rows: rows.map(portfolioRow) } satisfies PortfolioDto
})
