import { organisationCurrency } from '~~/server/domain/organisations'
import { allPortfolioRows, loadPortfolio, portfolioCsv } from '~~/server/domain/portfolio'
import { OrgParamsSchema } from '#shared/schemas/common'
import { PortfolioQuerySchema } from '#shared/schemas/portfolio'
import { READER_ROLES } from '#shared/utils/roles'

// The organisation's live sites with the headline figures of each one's latest assessment and its
// location for the map: paged, sorted by an allow-listed column (sites never assessed sort last),
// filtered by text, river, whether assessed and review state. `format=csv` downloads every matching
// row; `format=map` answers every matching row (bounded by PORTFOLIO_MAP_MAX) unpaged, for the map.
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, READER_ROLES)
  const { format, ...query } = await getValidatedQuery(event, validator(PortfolioQuerySchema, 'query'))
  if (format === 'csv') {
    const rows = await allPortfolioRows(useDb(), orgId, query)
    setResponseHeader(event, 'Content-Type', 'text/csv; charset=utf-8')
    setResponseHeader(event, 'Content-Disposition', `attachment; filename="gillwatt-portfolio-${orgId}.csv"`)
    return portfolioCsv(rows, await organisationCurrency(useDb(), orgId))
  }
  return loadPortfolio(useDb(), orgId, query, format === 'map' ? 'map' : 'page')
})
