// Turns a stored site (with its flow record, if any) and a stored option into the engine's input, and
// an engine result into the summary columns of an assessment row. No Nitro here: the server
// (server/utils/assessmentInput.ts) and the demo loader (db/seed.ts) both call it.
import type { Kysely } from 'kysely'
import type { AssessResult } from '../shared/engine/assess'
import { isaPressure } from '../shared/engine/atmosphere'
import { DEFAULTS } from '../shared/engine/defaults'
import { oxygenSaturation } from '../shared/engine/oxygenSaturation'
import { AssessInputSchema, type AssessInput, type AssessInputDraft } from '../shared/schemas/assess'
import type { OptionDesign, OptionSettings } from '../shared/schemas/option'
import type { Catchment, FdcPointInput, HeadRow, Month, ReservedFlow, Weir } from '../shared/schemas/site'
import type { AssessmentsTable, Database, OptionRow, SiteRow } from './schema'

/** The site cannot be assessed as it stands; `field` names what to fix (e.g. `site.hydrology`). */
export class AssessmentInputError extends Error {
  override readonly name = 'AssessmentInputError'
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message)
  }
}

/** A site's stored daily record as gauged (before scaling), with the area ratio its flows get. */
export interface StoredRecord {
  days: { date: string; flow: number | null }[]
  scale: { siteAreaKm2: number; gaugeAreaKm2: number } | null
}

/** What the builder needs of a stored option. */
export interface StoredOption {
  design: OptionDesign
  settings: OptionSettings
}

/** Upstream oxygen in mg/L: a %-saturation reading times the Benson & Krause saturation at the site's air pressure (as the engine computes it). */
export function oxygenMgL(reading: Month['upstreamOxygen'], waterTempC: number, altitudeM: number, salinity_gkg: number = DEFAULTS.salinity.value): number {
  if (reading.unit === 'mg/L') return reading.value
  return (reading.value / 100) * oxygenSaturation(waterTempC, isaPressure(altitudeM), salinity_gkg)
}

/**
 * The engine input for one option at one site, defaults filled in and checked with AssessInputSchema.
 * Hydrology: the stored record when there is one (its own area ratio as gaugeScaling), else the
 * entered FDC points (the site's catchment ratio as gaugeScaling). The site's downstream oxygen
 * target replaces the option's setting, since the regulator sets it per site.
 * Throws AssessmentInputError naming the field when the site cannot be assessed yet.
 */
export function buildAssessInput(site: SiteRow, record: StoredRecord | null, option: StoredOption): AssessInput {
  const weir = JSON.parse(site.weir) as Weir
  const months = JSON.parse(site.months) as Month[]
  const headTable = JSON.parse(site.head_table) as HeadRow[]
  const reserved = JSON.parse(site.reserved_flow) as ReservedFlow
  const points = JSON.parse(site.fdc_points) as FdcPointInput[]
  const catchment = site.catchment === null ? null : (JSON.parse(site.catchment) as Catchment)

  let hydrology: AssessInputDraft['hydrology']
  let gaugeScaling: AssessInputDraft['gaugeScaling'] = null
  if (record) {
    if (!record.days.some((d) => d.flow !== null)) {
      throw new AssessmentInputError('site.hydrology', 'the stored flow record has no day with a flow; upload another record or delete it and enter FDC points')
    }
    hydrology = { kind: 'record', days: record.days }
    if (record.scale) gaugeScaling = { siteArea_km2: record.scale.siteAreaKm2, gaugeArea_km2: record.scale.gaugeAreaKm2 }
  } else if (points.length >= 3) {
    hydrology = { kind: 'fdc', points }
    if (catchment) gaugeScaling = { siteArea_km2: catchment.siteAreaKm2, gaugeArea_km2: catchment.gaugeAreaKm2 }
  } else {
    throw new AssessmentInputError('site.hydrology', 'add FDC points or upload a flow record first')
  }
  if (months.length !== 12) throw new AssessmentInputError('site.months', 'needs 12 months, January first')

  const salinity = DEFAULTS.salinity.value
  const draft: AssessInputDraft = {
    site: {
      altitude_m: site.altitude_m,
      grossHead_m: weir.grossHeadM,
      headTable: headTable.map((r) => ({ flow_m3s: r.flow, head_m: r.head })),
      salinity_gkg: salinity,
      months: months.map((m) => ({
        temperature_C: m.waterTempC,
        upstreamOxygen_mgL: oxygenMgL(m.upstreamOxygen, m.waterTempC, site.altitude_m, salinity),
      })),
      waterQuality: weir.waterQuality,
      weirShape: weir.shape,
    },
    hydrology,
    gaugeScaling,
    reservedFlow: reserved,
    option: option.design,
    settings: { ...option.settings, oxygenTarget_mgL: site.target_oxygen_mgl },
  }
  const parsed = AssessInputSchema.safeParse(draft)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    throw new AssessmentInputError(issue.path.map(String).join('.') || 'input', issue.message)
  }
  return parsed.data
}

/** A stored option row's design and settings. */
export function storedOption(row: Pick<OptionRow, 'design' | 'settings'>): StoredOption {
  return { design: JSON.parse(row.design) as OptionDesign, settings: JSON.parse(row.settings) as OptionSettings }
}

/** The stored daily record of a site as gauged, or null when it has none. */
export async function loadStoredRecord(db: Kysely<Database>, siteId: number): Promise<StoredRecord | null> {
  const rec = await db.selectFrom('flow_records').select(['site_area_km2', 'gauge_area_km2']).where('site_id', '=', siteId).executeTakeFirst()
  if (!rec) return null
  const rows = await db.selectFrom('flow_days').select(['day', 'flow']).where('site_id', '=', siteId).orderBy('day').execute()
  return {
    days: rows.map((r) => ({ date: r.day, flow: r.flow })),
    scale: rec.site_area_km2 !== null && rec.gauge_area_km2 !== null ? { siteAreaKm2: rec.site_area_km2, gaugeAreaKm2: rec.gauge_area_km2 } : null,
  }
}

/** The headline columns of an assessment row, copied from the result's summary. */
export function summaryColumns(result: AssessResult) {
  const s = result.summary
  const raised = s.flags.filter((f) => f.raised).map((f) => f.id)
  return {
    annual_energy_mwh: s.annualEnergy_MWh,
    capacity_factor: s.capacityFactor,
    rated_power_kw: s.ratedPower_kW,
    min_cavitation_margin_m: s.minCavitationMargin_m,
    net_oxygen_gain_slf_mgl: s.netOxygenGainSummerLowFlow_mgL,
    lcoe: s.lcoe,
    flags_raised: JSON.stringify(raised),
    flag_count: raised.length,
  } satisfies Partial<Record<keyof AssessmentsTable, unknown>>
}

/**
 * Stores one engine run as an assessment of an option, with its exact input and whole result, in one
 * transaction (pass a transaction to join it); returns the new assessment's id.
 */
export async function insertAssessment(
  db: Kysely<Database>,
  args: {
    option: Pick<OptionRow, 'id' | 'site_id' | 'org_id'>
    userId: number | null
    input: AssessInput
    result: AssessResult
    supersedesId: number | null
  },
): Promise<number> {
  const write = async (trx: Kysely<Database>) => {
    const row = await trx
      .insertInto('assessments')
      .values({
        option_id: args.option.id,
        site_id: args.option.site_id,
        org_id: args.option.org_id,
        engine_version: args.result.engineVersion,
        ...summaryColumns(args.result),
        supersedes_id: args.supersedesId,
        created_by: args.userId,
      })
      .returning('id')
      .executeTakeFirstOrThrow()
    await trx.insertInto('assessment_payloads').values({ assessment_id: row.id, input_json: JSON.stringify(args.input), result_json: JSON.stringify(args.result) }).execute()
    return row.id
  }
  return db.isTransaction ? write(db) : db.transaction().execute(write)
}
