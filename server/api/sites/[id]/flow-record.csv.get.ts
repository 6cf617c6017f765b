import { Readable } from 'node:stream'
import Papa from 'papaparse'
import { scaleByAreaRatio } from '../../../../shared/engine/hydrology'
import { SiteParamsSchema } from '../../../../shared/schemas/site'
import { READER_ROLES } from '../../../../shared/utils/roles'

/** Days read and written per step, so a century (36,525 days) never sits in memory at once. */
const CHUNK_DAYS = 5000

/** The site's stored days as CSV lines, oldest first, a chunk at a time (keyset paging on the primary key). */
async function* csvChunks(siteId: number, scale: { siteAreaKm2: number; gaugeAreaKm2: number } | null): AsyncGenerator<string> {
  yield 'date,flow_m3s\r\n'
  let after = ''
  for (;;) {
    const rows = await useDb().selectFrom('flow_days').select(['day', 'flow']).where('site_id', '=', siteId).where('day', '>', after).orderBy('day').limit(CHUNK_DAYS).execute()
    if (!rows.length) return
    const flows = rows.map((r) => r.flow)
    const site = scale ? scaleByAreaRatio(flows, scale.siteAreaKm2, scale.gaugeAreaKm2) : flows
    // 12 significant figures drop the float noise of the scaling (2.7500000000000004 → 2.75); a gap stays an empty cell.
    yield Papa.unparse(rows.map((r, i) => [r.day, site[i] === null || site[i] === undefined ? null : Number(site[i]!.toPrecision(12))]), { newline: '\r\n' }) + '\r\n'
    if (rows.length < CHUNK_DAYS) return
    after = rows.at(-1)!.day
  }
}

// GET /api/sites/[id]/flow-record.csv: the stored daily record as site flows (after any area-ratio
// scaling), `date,flow_m3s`, one line a stored day, gaps as empty cells, as a download named after
// the site. Every role of the organisation; 404 for outsiders and for a site without a record.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { site } = await requireSite(event, id, READER_ROLES)
  const record = await loadFlowRecord(id)
  if (!record) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This site has no flow record' })
  const safeName = site.name.trim().replace(/[^\p{L}\p{N}]+/gu, '-').replace(/^-+|-+$/g, '') || 'site'
  setResponseHeader(event, 'Content-Type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'Content-Disposition', contentDisposition('attachment', `${safeName}-daily-flows.csv`))
  setResponseHeader(event, 'Cache-Control', 'private, no-store')
  return sendStream(event, Readable.from(csvChunks(id, record.scale)))
})
