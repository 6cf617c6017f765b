import { loadFlowRecord, loadSiteDays } from '~~/server/domain/flowRecords'
import { fdcFromPoints, fdcStats, reservedFlow, scaleFdcByAreaRatio } from '#shared/engine/hydrology'
import { SiteParamsSchema, type Catchment, type FdcPointInput, type ReservedFlow } from '#shared/schemas/site'
import type { HydrologyDto } from '#shared/schemas/flowRecord'
import { fdcChartPoints } from '#shared/utils/fdcChart'
import { READER_ROLES } from '#shared/utils/roles'

// The flow-duration curve the engine uses for this site: from the stored record when there is one,
// else from the entered points (scaled by the site's catchment when set); its statistics, the monthly
// statistics (record only) and the reserved flow. A record (up to 80,000 days, ranked whole and by
// month) is worked through in the engine pool; a few hundred entered points are not worth the trip.
export default defineEventHandler(async (event): Promise<HydrologyDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { site } = await requireSite(event, id, READER_ROLES)
  const setting = JSON.parse(site.reserved_flow) as ReservedFlow
  const record = await loadFlowRecord(useDb(), id)
  if (record && record.stats) {
    assertEngineRoom(event)
    const days = await loadSiteDays(useDb(), id, record.scale)
    const curves = await runEngine(event, { kind: 'record-hydrology', days, reservedFlow: setting })
    return { source: 'record', ...curves, reservedFlow: { setting, flow: curves.reservedFlow }, scale: record.scale }
  }
  const empty = Array.from({ length: 12 }, (_, k) => ({ month: k + 1, days: 0, stats: null }))
  const points = JSON.parse(site.fdc_points) as FdcPointInput[]
  if (points.length < 3) {
    return { source: 'none', points: [], stats: null, monthly: empty, reservedFlow: { setting, flow: setting.kind === 'fixed' ? setting.flow : null }, scale: null, count: 0 }
  }
  let fdc = fdcFromPoints(points)
  let scale: HydrologyDto['scale'] = null
  const catchment = site.catchment ? (JSON.parse(site.catchment) as Catchment) : null
  if (catchment) {
    fdc = scaleFdcByAreaRatio(fdc, catchment.siteArea_km2, catchment.gaugeArea_km2)
    scale = { ...catchment, factor: catchment.siteArea_km2 / catchment.gaugeArea_km2 }
  }
  return { source: 'points', points: fdcChartPoints(fdc), stats: fdcStats(fdc), monthly: empty, reservedFlow: { setting, flow: reservedFlow(setting, fdc) }, scale, count: fdc.count }
})
