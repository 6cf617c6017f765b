// Assessments: the engine input for a stored option at its stored site (with its flow record, if
// any), the input of a re-run, and storing one engine run (exact input, whole result, headline
// columns). The engine itself runs elsewhere (the worker pool on the server, in process in the seed);
// routes, the seed (db/seed.ts) and the benchmarks call these.
import type { Kysely } from 'kysely'
import type { AssessmentRow, AssessmentsTable, Database, OptionRow, SiteRow } from '../../db/schema'
import type { AssessResult } from '../../shared/engine/results'
import { AssessInputSchema, type AssessInput, type AssessInputDraft } from '../../shared/schemas/assess'
import type { OptionDesign, OptionSettings } from '../../shared/schemas/option'
import type { AssessmentCreate } from '../../shared/schemas/assessment'
import type { FlowRulesSetting } from '../../shared/schemas/flowRules'
import type { Catchment, FdcPointInput, HeadRow, Month, ReservedFlow, Weir } from '../../shared/schemas/site'
import { siteToEngine, SiteNotReadyError, type RecordForEngine } from '../../shared/utils/siteEngineInput'
import { conflict, unprocessable } from './errors'
import { inTransaction } from './transaction'

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
      altitude_m: site.altitude_m,
      weir: JSON.parse(site.weir) as Weir,
      headTable: JSON.parse(site.head_table) as HeadRow[],
      months: JSON.parse(site.months) as Month[],
      reservedFlow: JSON.parse(site.reserved_flow) as ReservedFlow,
      flowRules: JSON.parse(site.flow_rules) as FlowRulesSetting,
      catchment: site.catchment === null ? null : (JSON.parse(site.catchment) as Catchment),
      fdcPoints: JSON.parse(site.fdc_points) as FdcPointInput[],
      targetOxygen_mgL: site.target_oxygen_mgl,
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
    scale: rec.site_area_km2 !== null && rec.gauge_area_km2 !== null ? { siteArea_km2: rec.site_area_km2, gaugeArea_km2: rec.gauge_area_km2 } : null,
  }
}

/** The headline columns of an assessment row, copied from the result's summary, money, Monte Carlo and record years. */
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
    capex: result.money.capex,
    npv: result.money.npv,
    energy_p50_mwh: result.uncertainty?.energy_MWh.p50 ?? null,
    energy_p90_mwh: result.uncertainty?.energy_MWh.p90 ?? null,
    baseline_energy_mwh: result.baseline?.annualEnergy_MWh ?? null,
    net_loss_probability: result.uncertainty?.netLossProbability ?? null,
    record_p90_mwh: result.years?.p90Energy_MWh ?? null,
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
  return inTransaction(db, write)
}

/**
 * The engine input for a stored option at its stored site (flow record days when the site has a
 * record, else its FDC points), defaults filled in; 422 naming the field when it cannot be assessed.
 */
export async function assessmentInputFor(db: Kysely<Database>, site: SiteRow, option: Pick<OptionRow, 'design' | 'settings'>): Promise<AssessInput> {
  const record = await loadStoredRecord(db, site.id)
  try {
    return buildAssessInput(site, record, storedOption(option))
  } catch (error) {
    if (error instanceof SiteNotReadyError) throw unprocessable(error.field, error.message)
    throw error
  }
}

/** The 409 for re-running an assessment that already has a re-run. */
function alreadyRerun(oldId: number, laterId: number) {
  return conflict(`rerunOf: assessment ${oldId} was already re-run as assessment ${laterId}; re-run that one instead`, { supersededBy: laterId })
}

/** The assessment with this id; undefined when there is none. */
export async function assessmentById(db: Kysely<Database>, assessmentId: number): Promise<AssessmentRow | undefined> {
  return db.selectFrom('assessments').selectAll().where('id', '=', assessmentId).executeTakeFirst()
}

/** The whole stored result of an assessment, as the engine gave it (never recomputed). */
export async function storedResult(db: Kysely<Database>, assessmentId: number): Promise<AssessResult> {
  const payload = await db.selectFrom('assessment_payloads').select('result_json').where('assessment_id', '=', assessmentId).executeTakeFirstOrThrow()
  return JSON.parse(payload.result_json) as AssessResult
}

/**
 * What a new run of `option` re-runs, if anything: `rerunOf` must be an assessment of this option
 * not yet re-run (422, 409); with `use: 'stored'` its stored input is run again exactly (422 when
 * it no longer fits this engine), else `input` is null and the caller builds it afresh.
 */
export async function rerunBasis(
  db: Kysely<Database>,
  option: Pick<OptionRow, 'id'>,
  body: AssessmentCreate,
): Promise<{ supersedesId: number | null; input: AssessInput | null }> {
  if (body.rerunOf === undefined) return { supersedesId: null, input: null }
  const old = await db
    .selectFrom('assessments')
    .innerJoin('assessment_payloads', 'assessment_payloads.assessment_id', 'assessments.id')
    .select(['assessments.id', 'assessments.option_id', 'assessment_payloads.input_json'])
    .where('assessments.id', '=', body.rerunOf)
    .executeTakeFirst()
  if (!old || old.option_id !== option.id) throw unprocessable('rerunOf', `assessment ${body.rerunOf} is not an assessment of this option`)
  const later = await db.selectFrom('assessments').select('id').where('supersedes_id', '=', old.id).executeTakeFirst()
  if (later) throw alreadyRerun(old.id, later.id)
  if (body.use !== 'stored') return { supersedesId: old.id, input: null }
  const stored = AssessInputSchema.safeParse(JSON.parse(old.input_json))
  if (!stored.success) {
    const issue = stored.error.issues[0]!
    throw unprocessable('rerunOf', `the stored input no longer fits this engine (${issue.path.map(String).join('.')}: ${issue.message}); re-run with use 'current'`)
  }
  return { supersedesId: old.id, input: stored.data }
}

/**
 * Stores one engine run as an assessment of `option` (as insertAssessment); when two re-runs of the
 * same assessment race, the unique index lets one through and the other gets the 409.
 */
export async function storeAssessment(db: Kysely<Database>, args: Parameters<typeof insertAssessment>[1]): Promise<number> {
  try {
    return await insertAssessment(db, args)
  } catch (error) {
    if (args.supersedesId !== null && /UNIQUE constraint failed: assessments\.supersedes_id/.test(String(error))) {
      const later = await db.selectFrom('assessments').select('id').where('supersedes_id', '=', args.supersedesId).executeTakeFirst()
      throw alreadyRerun(args.supersedesId, later?.id ?? 0)
    }
    throw error
  }
}
