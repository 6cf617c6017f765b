import type { H3Event } from 'h3'
import type { ExpressionBuilder } from 'kysely'
import type { AssessmentRow, Database, OptionRow } from '../../db/schema'
import type { AssessResult, FlagId } from '../../shared/engine/assess'
import { ENGINE_VERSION } from '../../shared/engine/version'
import type { AssessInput } from '../../shared/schemas/assess'
import type { AssessmentDetailDto, AssessmentDto, OptionDesign, OptionDto, OptionInput, OptionSettings } from '../../shared/schemas/option'
import type { Role } from '../../shared/utils/roles'

/**
 * Gate for every option-scoped route: 401 signed out, 404 when the option does not exist, is
 * soft-deleted, or its site is deleted or belongs to an organisation the user is not in; 403 when
 * the user's role is not in `roles`.
 */
export async function requireOption(event: H3Event, optionId: number, roles: readonly Role[], notFound = 'Option not found') {
  await requireUser(event)
  const option = await useDb().selectFrom('options').selectAll().where('id', '=', optionId).where('deleted_at', 'is', null).executeTakeFirst()
  if (!option) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: notFound })
  const { user, role, site } = await requireSite(event, option.site_id, roles, { notFound })
  return { user, role, site, option }
}

/** Gate for an assessment: as `requireOption` for the option it belongs to; 404 when it does not exist. */
export async function requireAssessment(event: H3Event, assessmentId: number, roles: readonly Role[]) {
  await requireUser(event)
  const assessment = await useDb().selectFrom('assessments').selectAll().where('id', '=', assessmentId).executeTakeFirst()
  if (!assessment) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Assessment not found' })
  const { user, role, site, option } = await requireOption(event, assessment.option_id, roles, 'Assessment not found')
  return { user, role, site, option, assessment }
}

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
    'assessments.flags_raised',
    eb.selectFrom('users').select('users.name').whereRef('users.id', '=', 'assessments.created_by').as('creator_name'),
    eb.selectFrom('assessments as later').select('later.id').whereRef('later.supersedes_id', '=', 'assessments.id').limit(1).as('superseded_by'),
  ] as const
}

/** What `selectAssessmentSummary` reads. */
export type AssessmentSummaryRow = Pick<
  AssessmentRow,
  | 'id' | 'site_id' | 'option_id' | 'engine_version' | 'created_at' | 'created_by' | 'supersedes_id'
  | 'annual_energy_mwh' | 'capacity_factor' | 'rated_power_kw' | 'min_cavitation_margin_m' | 'net_oxygen_gain_slf_mgl' | 'lcoe' | 'flags_raised'
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
    annualEnergyMWh: row.annual_energy_mwh,
    capacityFactor: row.capacity_factor,
    ratedPowerKw: row.rated_power_kw,
    minCavitationMarginM: row.min_cavitation_margin_m,
    netOxygenGainSlfMgL: row.net_oxygen_gain_slf_mgl,
    lcoe: row.lcoe,
    flagsRaised: JSON.parse(row.flags_raised) as FlagId[],
  }
}

/** One assessment's summary by id, or undefined. */
export async function loadAssessmentSummary(id: number): Promise<AssessmentDto | undefined> {
  const row = await useDb().selectFrom('assessments').select(selectAssessmentSummary).where('assessments.id', '=', id).executeTakeFirst()
  return row ? assessmentDto(row) : undefined
}

/** The newest assessment of each of `optionIds` (one indexed look-up each, in one query). */
export async function latestAssessments(optionIds: readonly number[]): Promise<Map<number, AssessmentDto>> {
  if (optionIds.length === 0) return new Map()
  const rows = await useDb()
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
export async function loadOptionDto(row: OptionRow): Promise<OptionDto> {
  const [creator, latest] = await Promise.all([
    row.created_by === null ? undefined : useDb().selectFrom('users').select('name').where('id', '=', row.created_by).executeTakeFirst(),
    latestAssessments([row.id]),
  ])
  return optionDto(row, creator?.name ?? null, latest.get(row.id) ?? null)
}

/** One stored assessment with its exact input and whole result, as stored (never recomputed). */
export async function loadAssessmentDetail(id: number): Promise<AssessmentDetailDto | undefined> {
  const row = await useDb()
    .selectFrom('assessments')
    .innerJoin('assessment_payloads', 'assessment_payloads.assessment_id', 'assessments.id')
    .select(selectAssessmentSummary)
    .select(['assessment_payloads.input_json', 'assessment_payloads.result_json'])
    .where('assessments.id', '=', id)
    .executeTakeFirst()
  if (!row) return undefined
  return { ...assessmentDto(row), input: JSON.parse(row.input_json) as AssessInput, result: JSON.parse(row.result_json) as AssessResult }
}
