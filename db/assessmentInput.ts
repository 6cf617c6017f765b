// Turns a stored site (with its flow record, if any) and a stored option into the engine's input, and
// an engine result into the summary columns of an assessment row. No Nitro here: the server
// (server/utils/assessmentInput.ts) and the demo loader (db/seed.ts) both call it.
import type { Kysely } from 'kysely'
import type { AssessResult } from '../shared/engine/assess'
import { AssessInputSchema, type AssessInput, type AssessInputDraft } from '../shared/schemas/assess'
import type { OptionDesign, OptionSettings } from '../shared/schemas/option'
import type { Catchment, FdcPointInput, HeadRow, Month, ReservedFlow, Weir } from '../shared/schemas/site'
import { siteToEngine, SiteNotReadyError, type RecordForEngine } from '../shared/utils/siteEngineInput'
import type { AssessmentsTable, Database, OptionRow, SiteRow } from './schema'

/** A site's stored daily record as gauged (before scaling), with the area ratio its flows get. */
export type StoredRecord = RecordForEngine

/** What the builder needs of a stored option. */
export interface StoredOption {
  design: OptionDesign
  settings: OptionSettings
}

/**
 * The engine input for one option at one site, defaults filled in and checked with AssessInputSchema:
 * the site's part from `siteToEngine` (shared with the browser's live preview), the option's design
 * and settings, and the site's downstream oxygen target in place of the option's (the regulator
 * sets it per site).
 * Throws SiteNotReadyError naming the field when the site cannot be assessed yet.
 */
export function buildAssessInput(site: SiteRow, record: StoredRecord | null, option: StoredOption): AssessInput {
  const { targetOxygen_mgL, ...sitePart } = siteToEngine(
    {
      altitudeM: site.altitude_m,
      weir: JSON.parse(site.weir) as Weir,
      headTable: JSON.parse(site.head_table) as HeadRow[],
      months: JSON.parse(site.months) as Month[],
      reservedFlow: JSON.parse(site.reserved_flow) as ReservedFlow,
      catchment: site.catchment === null ? null : (JSON.parse(site.catchment) as Catchment),
      fdcPoints: JSON.parse(site.fdc_points) as FdcPointInput[],
      targetOxygenMgL: site.target_oxygen_mgl,
    },
    record,
  )
  const draft: AssessInputDraft = { ...sitePart, option: option.design, settings: { ...option.settings, oxygenTarget_mgL: targetOxygen_mgL } }
  const parsed = AssessInputSchema.safeParse(draft)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    throw new SiteNotReadyError(issue.path.map(String).join('.') || 'input', issue.message)
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
