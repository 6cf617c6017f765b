// The site's part of the engine's input, from a site as the API describes it. One mapping for the
// server's stored assessments (db/assessmentInput.ts) and the browser's live preview
// (composables/useLivePreview.ts), so both compute from the same input.
import { isaPressure } from '../engine/atmosphere'
import { DEFAULTS } from '../engine/defaults'
import { oxygenSaturation } from '../engine/oxygenSaturation'
import type { AssessInputDraft } from '../schemas/assess'
import type { FlowRulesSetting } from '../schemas/flowRules'
import type { Catchment, FdcPointInput, HeadRow, Month, ReservedFlow, Weir } from '../schemas/site'

/** What the mapping needs of a site. */
export interface SiteForEngine {
  altitude_m: number
  weir: Weir
  headTable: HeadRow[]
  months: Month[]
  reservedFlow: ReservedFlow
  /** Flow rules beyond the hands-off flow; left out, none. */
  flowRules?: FlowRulesSetting
  catchment: Catchment | null
  fdcPoints: FdcPointInput[]
  targetOxygen_mgL: number
}

/** A daily record for the engine, with the area ratio its flows still need (null when already at the site). */
export interface RecordForEngine {
  days: { date: string; flow: number | null }[]
  scale: { siteArea_km2: number; gaugeArea_km2: number } | null
}

/** The site's part of an engine input, and the downstream oxygen target the site's regulator sets. */
export type EngineSitePart = Pick<AssessInputDraft, 'site' | 'hydrology' | 'gaugeScaling' | 'reservedFlow' | 'flowRules'> & { targetOxygen_mgL: number }

/** The site cannot be assessed as it stands; `field` names what to fix (e.g. `site.hydrology`). */
export class SiteNotReadyError extends Error {
  override readonly name = 'SiteNotReadyError'
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message)
  }
}

/** Upstream oxygen in mg/L: a %-saturation reading times the Benson & Krause saturation at the site's air pressure (as the engine computes it). */
export function upstreamOxygenMgL(reading: Month['upstreamOxygen'], waterTemp_C: number, altitude_m: number, salinity_gkg: number = DEFAULTS.salinity.value): number {
  if (reading.unit === 'mg/L') return reading.value
  return (reading.value / 100) * oxygenSaturation(waterTemp_C, isaPressure(altitude_m), salinity_gkg)
}

/**
 * The twelve month flows when every one is entered, else null: the engine shapes an entered curve
 * only by a whole profile, so a partial one is passed as none.
 */
function seasonalProfile(months: readonly Month[]): number[] | null {
  const flows = months.map((m) => m.flow_m3s)
  return flows.length === 12 && flows.every((q): q is number => typeof q === 'number') ? flows : null
}

/**
 * The site's part of the engine input. Hydrology: the daily record when there is one (its own area
 * ratio as gaugeScaling), else the entered FDC points (the site's catchment ratio as gaugeScaling).
 * Throws SiteNotReadyError naming the field when the site cannot be assessed yet.
 */
export function siteToEngine(site: SiteForEngine, record: RecordForEngine | null): EngineSitePart {
  let hydrology: AssessInputDraft['hydrology']
  let gaugeScaling: AssessInputDraft['gaugeScaling'] = null
  if (record) {
    if (!record.days.some((d) => d.flow !== null)) {
      throw new SiteNotReadyError('site.hydrology', 'the stored flow record has no day with a flow; upload another record or delete it and enter FDC points')
    }
    hydrology = { kind: 'record', days: record.days }
    if (record.scale) gaugeScaling = { siteArea_km2: record.scale.siteArea_km2, gaugeArea_km2: record.scale.gaugeArea_km2 }
  } else if (site.fdcPoints.length >= 3) {
    hydrology = { kind: 'fdc', points: site.fdcPoints }
    if (site.catchment) gaugeScaling = { siteArea_km2: site.catchment.siteArea_km2, gaugeArea_km2: site.catchment.gaugeArea_km2 }
  } else {
    throw new SiteNotReadyError('site.hydrology', 'add FDC points or upload a flow record first')
  }
  if (site.months.length !== 12) throw new SiteNotReadyError('site.months', 'needs 12 months, January first')
  const salinity = DEFAULTS.salinity.value
  const profile = seasonalProfile(site.months)
  return {
    site: {
      altitude_m: site.altitude_m,
      grossHead_m: site.weir.grossHead_m,
      headTable: site.headTable.map((r) => ({ flow_m3s: r.flow, head_m: r.head })),
      salinity_gkg: salinity,
      months: site.months.map((m, i) => ({
        temperature_C: m.waterTemp_C,
        upstreamOxygen_mgL: upstreamOxygenMgL(m.upstreamOxygen, m.waterTemp_C, site.altitude_m, salinity),
        // Sites stored before the flag came have none: their readings count as measured.
        upstreamMeasured: m.upstreamOxygen.measured ?? true,
        ...(profile ? { flow_m3s: profile[i] } : {}),
      })),
      waterQuality: site.weir.waterQuality,
      weirShape: site.weir.shape,
      crestLength_m: site.weir.crestWidth_m,
      // Sites stored before the weir models came have neither field: Butts & Evans, nothing measured.
      weirAeration: {
        model: site.weir.aerationModel ?? 'butts-evans',
        measured: site.weir.measuredDeficitRatio
          ? { r: site.weir.measuredDeficitRatio.r, tC: site.weir.measuredDeficitRatio.temperature_C, drowned: site.weir.measuredDeficitRatio.drowned }
          : null,
      },
      // Sites stored before the weir hydraulics came have none: heads from the head table.
      hydraulics: site.weir.hydraulics ?? null,
    },
    hydrology,
    gaugeScaling,
    reservedFlow: site.reservedFlow,
    ...(site.flowRules ? { flowRules: site.flowRules } : {}),
    targetOxygen_mgL: site.targetOxygen_mgL,
  }
}
