import { Readable } from 'node:stream'
import { requireFlowRecord, siteDaysCsv } from '~~/server/domain/flowRecords'
import { SiteParamsSchema } from '#shared/schemas/site'
import { READER_ROLES } from '#shared/utils/roles'

// GET /api/sites/[id]/flow-record.csv: the stored daily record as site flows (after any area-ratio
// scaling), `date,flow_m3s`, one line a stored day, gaps as empty cells, as a download named after
// the site. Every role of the organisation; 404 for outsiders and for a site without a record.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { site } = await requireSite(event, id, READER_ROLES)
  const record = await requireFlowRecord(useDb(), id)
  const safeName = site.name.trim().replace(/[^\p{L}\p{N}]+/gu, '-').replace(/^-+|-+$/g, '') || 'site'
  setResponseHeader(event, 'Content-Type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'Content-Disposition', contentDisposition('attachment', `${safeName}-daily-flows.csv`))
  setResponseHeader(event, 'Cache-Control', 'private, no-store')
  return sendStream(event, Readable.from(siteDaysCsv(useDb(), id, record.scale)))
})
