// Design options of a site: creating, changing and deleting them, listing them with their newest
// assessment, comparing several, and stored assessments as the API shows them.
import { sql, type ExpressionBuilder, type Kysely } from 'kysely'
import type { AssessmentRow, Database, OptionRow, SiteRow } from '../../db/schema'
import type { AssessResult, BaselineResult, FlagId } from '../../shared/engine/results'
import { ENGINE_VERSION } from '../../shared/engine/version'
import type { AssessInput } from '../../shared/schemas/assess'
import type { OptionDesign, OptionDto, OptionInput, OptionPatch, OptionSettings } from '../../shared/schemas/option'
import type { AssessmentDetailDto, AssessmentDto, AssessmentListDto, AssessmentListQuery } from '../../shared/schemas/assessment'
import type { CompareDto, CompareItem, OrgOptionsDto } from '../../shared/schemas/compare'
import { notFound } from './errors'
import { staleVersionError } from './sites'

/** The design and settings columns of an accepted option input. */
export function optionColumns(input: Partial<OptionInput>) {
  const cols: Partial<Pick<OptionRow, 'name' | 'notes' | 'design' | 'settings'>> = {}
  if (input.name !== undefined) cols.name = input.name
  if (input.notes !== undefined) cols.notes = input.notes
  if (input.design !== undefined) cols.design = JSON.stringify(input.design)
  if (input.settings !== undefined) cols.settings = JSON.stringify(input.settings)
  return cols
}

/** The assessment columns every summary needs, with the creator's name and the id of the re-run, if any. */
export function selectAssessmentSummary(eb: ExpressionBuilder<Database, 'assessments'>) {
  return [
    'assessments.id',
    'assessments.site_id',
    'assessments.option_id',
    'assessments.engine_version',
    'assessments.created_at',
    'assessments.created_by',
    'assessments.supersedes_id',
    'assessments.annual_energy_mwh',
    'assessments.capacity_factor',
    'assessments.rated_power_kw',
    'assessments.min_cavitation_margin_m',
    'assessments.net_oxygen_gain_slf_mgl',
    'assessments.lcoe',
    'assessments.capex',
    'assessments.npv',
    'assessments.energy_p50_mwh',
    'assessments.energy_p90_mwh',
    'assessments.net_loss_probability',
    'assessments.record_p90_mwh',
    'assessments.baseline_energy_mwh',
    'assessments.flags_raised',
    eb.selectFrom('users').select('users.name').whereRef('users.id', '=', 'assessments.created_by').as('creator_name'),
    eb.selectFrom('assessments as later').select('later.id').whereRef('later.supersedes_id', '=', 'assessments.id').limit(1).as('superseded_by'),
  ] as const
}

/** What `selectAssessmentSummary` reads. */
export type AssessmentSummaryRow = Pick<
  AssessmentRow,
  | 'id' | 'site_id' | 'option_id' | 'engine_version' | 'created_at' | 'created_by' | 'supersedes_id'
  | 'annual_energy_mwh' | 'capacity_factor' | 'rated_power_kw' | 'min_cavitation_margin_m' | 'net_oxygen_gain_slf_mgl' | 'lcoe' | 'capex' | 'npv'
  | 'energy_p50_mwh' | 'energy_p90_mwh' | 'net_loss_probability' | 'record_p90_mwh' | 'baseline_energy_mwh' | 'flags_raised'
> & { creator_name: string | null; superseded_by: number | null }

/** An assessment row as the API shows it (without its tables); `stale` compares with this server's engine. */
export function assessmentDto(row: AssessmentSummaryRow): AssessmentDto {
  return {
    id: row.id,
    siteId: row.site_id,
    optionId: row.option_id,
    engineVersion: row.engine_version,
    stale: row.engine_version !== ENGINE_VERSION,
    createdAt: row.created_at,
    createdBy: row.created_by !== null && row.creator_name ? { id: row.created_by, name: row.creator_name } : null,
    supersedes: row.supersedes_id,
    supersededBy: row.superseded_by,
    annualEnergy_MWh: row.annual_energy_mwh,
    capacityFactor: row.capacity_factor,
    ratedPower_kW: row.rated_power_kw,
    minCavitationMargin_m: row.min_cavitation_margin_m,
    netOxygenGainSummerLowFlow_mgL: row.net_oxygen_gain_slf_mgl,
    lcoe: row.lcoe,
    capex: row.capex,
    npv: row.npv,
    energyP50_MWh: row.energy_p50_mwh,
    energyP90_MWh: row.energy_p90_mwh,
    netLossProbability: row.net_loss_probability,
    recordP90_MWh: row.record_p90_mwh,
    baselineEnergy_MWh: row.baseline_energy_mwh,
    flagsRaised: JSON.parse(row.flags_raised) as FlagId[],
  }
}

/** The newest assessment of each of `optionIds` (one indexed look-up each, in one query). */
export async function latestAssessments(db: Kysely<Database>, optionIds: readonly number[]): Promise<Map<number, AssessmentDto>> {
  if (optionIds.length === 0) return new Map()
  const rows = await db
    .selectFrom('assessments')
    .select(selectAssessmentSummary)
    .where('assessments.id', 'in', (eb) =>
      eb
        .selectFrom('options')
        .select((o) =>
          o
            .selectFrom('assessments as newest')
            .select('newest.id')
            .whereRef('newest.option_id', '=', 'options.id')
            .orderBy('newest.id', 'desc')
            .limit(1)
            .as('latest_id'),
        )
        .where('options.id', 'in', [...optionIds]),
    )
    .execute()
  return new Map(rows.map((r) => [r.option_id, assessmentDto(r)]))
}

/** An option row as the API shows it. */
export function optionDto(row: OptionRow, creatorName: string | null, latest: AssessmentDto | null): OptionDto {
  return {
    id: row.id,
    siteId: row.site_id,
    orgId: row.org_id,
    name: row.name,
    notes: row.notes,
    design: JSON.parse(row.design) as OptionDesign,
    settings: JSON.parse(row.settings) as OptionSettings,
    version: row.version,
    createdAt: row.created_at,
    updatedAt: row.updated_at,
    createdBy: row.created_by !== null && creatorName ? { id: row.created_by, name: creatorName } : null,
    latestAssessment: latest,
  }
}

/** Loads the creator and the latest assessment of one option row and shapes it for the API. */
export async function loadOptionDto(db: Kysely<Database>, row: OptionRow): Promise<OptionDto> {
  const [creator, latest] = await Promise.all([
    row.created_by === null ? undefined : db.selectFrom('users').select('name').where('id', '=', row.created_by).executeTakeFirst(),
    latestAssessments(db, [row.id]),
  ])
  return optionDto(row, creator?.name ?? null, latest.get(row.id) ?? null)
}

/** The option with this id unless it was deleted; undefined otherwise. */
export async function liveOptionById(db: Kysely<Database>, optionId: number): Promise<OptionRow | undefined> {
  return db.selectFrom('options').selectAll().where('id', '=', optionId).where('deleted_at', 'is', null).executeTakeFirst()
}

/** One stored assessment with its exact input and whole result, as stored (never recomputed). */
export async function loadAssessmentDetail(db: Kysely<Database>, id: number): Promise<AssessmentDetailDto | undefined> {
  const row = await db
    .selectFrom('assessments')
    .innerJoin('assessment_payloads', 'assessment_payloads.assessment_id', 'assessments.id')
    .select(selectAssessmentSummary)
    .select(['assessment_payloads.input_json', 'assessment_payloads.result_json'])
    .where('assessments.id', '=', id)
    .executeTakeFirst()
  if (!row) return undefined
  return { ...assessmentDto(row), input: JSON.parse(row.input_json) as AssessInput, result: JSON.parse(row.result_json) as AssessResult }
}

/** Stores a new option of `site`; `columns` are its design and settings as stored JSON. Returns its row. */
export async function createOption(
  db: Kysely<Database>,
  args: { site: Pick<SiteRow, 'id' | 'org_id'>; userId: number | null; name: string; notes: string; design: string; settings: string },
): Promise<OptionRow> {
  return db
    .insertInto('options')
    .values({ site_id: args.site.id, org_id: args.site.org_id, name: args.name, notes: args.notes, design: args.design, settings: args.settings, created_by: args.userId })
    .returningAll()
    .executeTakeFirstOrThrow()
}

/** Stores a new option of `site` from an accepted option input. */
export function createOptionFromInput(db: Kysely<Database>, site: Pick<SiteRow, 'id' | 'org_id'>, userId: number | null, input: OptionInput): Promise<OptionRow> {
  const cols = optionColumns(input)
  return createOption(db, { site, userId, name: input.name, notes: input.notes, design: cols.design!, settings: cols.settings! })
}

/**
 * Applies `patch` to a live option when the stored version is still `patch.version` (409 otherwise).
 * Stored assessments keep the input they ran. Returns the new row and the names of the fields given.
 */
export async function updateOption(db: Kysely<Database>, optionId: number, { version, ...fields }: OptionPatch, now: string): Promise<{ option: OptionRow; changed: string[] }> {
  const changed = Object.keys(fields).filter((k) => fields[k as keyof typeof fields] !== undefined)
  const updated = await db
    .updateTable('options')
    .set({ ...optionColumns(fields), version: sql<number>`version + 1`, updated_at: now })
    .where('id', '=', optionId)
    .where('version', '=', version)
    .where('deleted_at', 'is', null)
    .returningAll()
    .executeTakeFirst()
  if (!updated) throw await staleVersionError(db, 'options', optionId, version, 'option')
  return { option: updated, changed }
}

/** Deletes an option softly: it and its assessments leave every list, nothing is erased. */
export async function deleteOption(db: Kysely<Database>, optionId: number, userId: number, now: string): Promise<void> {
  await db.updateTable('options').set({ deleted_at: now, deleted_by: userId }).where('id', '=', optionId).where('deleted_at', 'is', null).execute()
}

/** The live options of a site, oldest first, each with its newest assessment. */
export async function listOptions(db: Kysely<Database>, siteId: number): Promise<OptionDto[]> {
  const rows = await db
    .selectFrom('options')
    .leftJoin('users', 'users.id', 'options.created_by')
    .selectAll('options')
    .select('users.name as creator_name')
    .where('options.site_id', '=', siteId)
    .where('options.deleted_at', 'is', null)
    .orderBy('options.id')
    .execute()
  const latest = await latestAssessments(db, rows.map((r) => r.id))
  return rows.map(({ creator_name, ...row }) => optionDto(row, creator_name, latest.get(row.id) ?? null))
}

/** One page of an option's stored assessments, newest first, without their tables. */
export async function listAssessments(db: Kysely<Database>, optionId: number, query: AssessmentListQuery): Promise<AssessmentListDto> {
  const [rows, total] = await Promise.all([
    db
      .selectFrom('assessments')
      .select(selectAssessmentSummary)
      .where('assessments.option_id', '=', optionId)
      .orderBy('assessments.id', 'desc')
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize)
      .execute(),
    db.selectFrom('assessments').select((eb) => eb.fn.countAll<number>().as('n')).where('option_id', '=', optionId).executeTakeFirstOrThrow(),
  ])
  return { optionId, page: query.page, pageSize: query.pageSize, total: Number(total.n), assessments: rows.map(assessmentDto) }
}

/**
 * Options side by side, from any live sites of organisations `userId` belongs to: design, settings,
 * site and latest assessment, in the order asked. 404 naming the first option that is missing,
 * deleted or not visible (ids do not leak across organisations).
 */
export async function compareOptions(db: Kysely<Database>, userId: number, ids: readonly number[]): Promise<CompareDto> {
  const rows = await db
    .selectFrom('options')
    .innerJoin('sites', 'sites.id', 'options.site_id')
    .innerJoin('memberships', (j) => j.onRef('memberships.org_id', '=', 'sites.org_id').on('memberships.user_id', '=', userId))
    .innerJoin('organisations', 'organisations.id', 'sites.org_id')
    .select([
      'options.id',
      'options.name',
      'options.design',
      'options.settings',
      'options.version',
      'sites.id as site_id',
      'sites.org_id',
      'sites.name as site_name',
      'sites.river_name',
      'sites.gross_head_m',
      'organisations.currency_code',
      'organisations.currency_symbol',
    ])
    .where('options.id', 'in', [...ids])
    .where('options.deleted_at', 'is', null)
    .where('sites.deleted_at', 'is', null)
    .execute()
  const byId = new Map(rows.map((r) => [r.id, r]))
  const missing = ids.find((id) => !byId.has(id))
  if (missing !== undefined) throw notFound(`options: option ${missing} not found`)
  const latest = await latestAssessments(db, ids)
  const baselines = await storedBaselines(db, [...latest.values()].map((a) => a.id))
  return {
    items: ids.map((id) => {
      const r = byId.get(id)!
      return {
        option: { id: r.id, name: r.name, design: JSON.parse(r.design) as OptionDesign, settings: JSON.parse(r.settings) as OptionSettings, version: r.version },
        site: { id: r.site_id, orgId: r.org_id, name: r.site_name, riverName: r.river_name, grossHead_m: r.gross_head_m, currency: { code: r.currency_code, symbol: r.currency_symbol } },
        latestAssessment: latest.get(id) ?? null,
        baseline: baselines.get(latest.get(id)?.id ?? 0) ?? null,
      }
    }),
  }
}

/** The conventional-turbine figures the comparison shows, of each of `assessmentIds`, read from the stored results (none for a run stored before the baseline). */
async function storedBaselines(db: Kysely<Database>, assessmentIds: readonly number[]): Promise<Map<number, CompareItem['baseline']>> {
  if (assessmentIds.length === 0) return new Map()
  const rows = await db
    .selectFrom('assessment_payloads')
    .select(['assessment_id', sql<string | null>`json_extract(result_json, '$.baseline')`.as('baseline_json')])
    .where('assessment_id', 'in', [...assessmentIds])
    .execute()
  return new Map(rows.map((r) => {
    const b = r.baseline_json === null ? null : (JSON.parse(r.baseline_json) as BaselineResult)
    return [r.assessment_id, b && {
      kindLabel: b.kindLabel, annualEnergy_MWh: b.annualEnergy_MWh, energyGivenUp_MWh: b.energyGivenUp_MWh,
      oxygenGainedOverBaseline_mgL: b.oxygenGainedOverBaseline_mgL, oxygenPerMWhGivenUp: b.oxygenPerMWhGivenUp, lcoe: b.lcoe,
    }]
  }))
}

/**
 * An organisation's live sites, by name and paged, each with its live options and their newest
 * assessments: what the comparison's picker shows, in three queries.
 */
export async function listOrgOptions(db: Kysely<Database>, orgId: number, page: number, pageSize: number): Promise<OrgOptionsDto> {
  const live = db.selectFrom('sites').where('sites.org_id', '=', orgId).where('sites.deleted_at', 'is', null)
  const [sites, total] = await Promise.all([
    live.select(['sites.id', 'sites.name', 'sites.river_name']).orderBy('sites.name').orderBy('sites.id').limit(pageSize).offset((page - 1) * pageSize).execute(),
    live.select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  const rows = sites.length === 0
    ? []
    : await db
        .selectFrom('options')
        .leftJoin('users', 'users.id', 'options.created_by')
        .selectAll('options')
        .select('users.name as creator_name')
        .where('options.site_id', 'in', sites.map((s) => s.id))
        .where('options.deleted_at', 'is', null)
        .orderBy('options.id')
        .execute()
  const latest = await latestAssessments(db, rows.map((r) => r.id))
  return {
    page,
    pageSize,
    total: Number(total.n),
    sites: sites.map((s) => ({
      siteId: s.id,
      siteName: s.name,
      riverName: s.river_name,
      options: rows
        .filter((r) => r.site_id === s.id)
        .map(({ creator_name, ...row }) => optionDto(row, creator_name, latest.get(row.id) ?? null)),
    })),
  }
}
