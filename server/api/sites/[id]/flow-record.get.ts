import { loadSiteDays, requireFlowRecord } from '~~/server/domain/flowRecords'
import { SiteParamsSchema } from '#shared/schemas/site'
import { FlowRecordQuerySchema, type FlowRecordDto } from '#shared/schemas/flowRecord'
import { READER_ROLES } from '#shared/utils/roles'

// The stored daily flow record: its summary and the days (site flows after any scaling), optionally
// from/to inclusive. 404 when the site has no record.
export default defineEventHandler(async (event): Promise<FlowRecordDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  await requireSite(event, id, READER_ROLES)
  const range = await getValidatedQuery(event, validator(FlowRecordQuerySchema, 'query'))
  const record = await requireFlowRecord(useDb(), id)
  return { record, days: await loadSiteDays(useDb(), id, record.scale, range) }
})
