import { fdcFromPoints, fdcFromRecord, fdcStats, monthlyFdcs, reservedFlow, scaleFdcByAreaRatio, type Fdc } from '../../../../shared/engine/hydrology'
import { SiteParamsSchema, type Catchment, type FdcPointInput, type HydrologyDto, type ReservedFlow } from '../../../../shared/schemas/site'
import { READER_ROLES } from '../../../../shared/utils/roles'

/** Most points sent for charting a curve. */
const CHART_POINTS = 200

/** At most `max` nodes of a curve, evenly spread by index, first and last kept. */
function chartPoints(fdc: Fdc, max = CHART_POINTS) {
  const n = fdc.exceedance.length
  const take = Math.min(n, max)
  const out: { exceedance: number; flow: number }[] = []
  for (let k = 0; k < take; k++) {
    const i = take === 1 ? 0 : Math.round((k * (n - 1)) / (take - 1))
    out.push({ exceedance: fdc.exceedance[i]!, flow: fdc.flow[i]! })
  }
  return out
}

// The flow-duration curve the engine uses for this site: from the stored record when there is one,
// else from the entered points (scaled by the site's catchment when set); its statistics, the monthly
// statistics (record only) and the reserved flow.
export default defineEventHandler(async (event): Promise<HydrologyDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { site } = await requireSite(event, id, READER_ROLES)
  const setting = JSON.parse(site.reserved_flow) as ReservedFlow
  const record = await loadFlowRecord(id)
  const empty = Array.from({ length: 12 }, (_, k) => ({ month: k + 1, days: 0, stats: null }))

  let fdc: Fdc | null = null
  let monthly: HydrologyDto['monthly'] = empty
  let scale: HydrologyDto['scale'] = null
  let source: HydrologyDto['source'] = 'none'
  if (record && record.stats) {
    const days = await loadSiteDays(id, record.scale)
    fdc = fdcFromRecord(days)
    const counts = new Array<number>(12).fill(0)
    for (const d of days) if (d.flow !== null) counts[Number(d.date.slice(5, 7)) - 1]! += 1
    monthly = monthlyFdcs(days).map((m, k) => ({ month: k + 1, days: counts[k]!, stats: m ? fdcStats(m) : null }))
    scale = record.scale
    source = 'record'
  } else {
    const points = JSON.parse(site.fdc_points) as FdcPointInput[]
    if (points.length >= 3) {
      fdc = fdcFromPoints(points)
      const catchment = site.catchment ? (JSON.parse(site.catchment) as Catchment) : null
      if (catchment) {
        fdc = scaleFdcByAreaRatio(fdc, catchment.siteAreaKm2, catchment.gaugeAreaKm2)
        scale = { ...catchment, factor: catchment.siteAreaKm2 / catchment.gaugeAreaKm2 }
      }
      source = 'points'
    }
  }
  return {
    source,
    points: fdc ? chartPoints(fdc) : [],
    stats: fdc ? fdcStats(fdc) : null,
    monthly,
    reservedFlow: { setting, flow: fdc ? reservedFlow(setting, fdc) : setting.kind === 'fixed' ? setting.flow : null },
    scale,
    count: fdc?.count ?? 0,
  }
})
