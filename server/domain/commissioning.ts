// Commissioning records of a site: the assessment a measurement is checked against (its stored
// input), storing a record with the figures the engine computed, listing, the latest one in a line
// for the reviewer's brief and the landowner summary, and marking one deleted. The engine itself runs
// elsewhere (the worker pool on the server, in process in the seed).
import { sql, type Kysely } from 'kysely'
import type { CommissioningRecordRow, Database } from '../../db/schema'
import type { CommissioningResult, ManometerFluid, OxygenPoint } from '../../shared/engine/commissioning'
import { optionDischargeCoefficient } from '../../shared/engine/commissioning'
import type { ReadingUnit } from '../../shared/engine/metering'
import { AssessInputSchema, type AssessInput } from '../../shared/schemas/assess'
import type { CommissioningBasisDto, CommissioningInput, CommissioningLine, CommissioningListDto, CommissioningRecordDto } from '../../shared/schemas/commissioning'
import { commissioningSentence } from '../../shared/utils/commissioningWords'
import { unprocessable } from './errors'

/** Most assessments offered to check against: the newest ones. */
const MAX_BASES = 50

/**
 * The stored input of the assessment a record checks, and its option: the assessment must be of this
 * site and of a live option (422 naming `assessmentId` otherwise, or when its stored input no
 * longer fits this engine).
 */
export async function commissioningBasis(db: Kysely<Database>, siteId: number, assessmentId: number): Promise<{ optionId: number; input: AssessInput }> {
  const row = await db
    .selectFrom('assessments')
    .innerJoin('options', 'options.id', 'assessments.option_id')
    .innerJoin('assessment_payloads', 'assessment_payloads.assessment_id', 'assessments.id')
    .select(['assessments.option_id', 'assessment_payloads.input_json'])
    .where('assessments.id', '=', assessmentId)
    .where('assessments.site_id', '=', siteId)
    .where('options.deleted_at', 'is', null)
    .executeTakeFirst()
  if (!row) throw unprocessable('assessmentId', `assessment ${assessmentId} is not an assessment of a live option of this site`)
  const parsed = AssessInputSchema.safeParse(JSON.parse(row.input_json))
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    throw unprocessable('assessmentId', `the stored input of assessment ${assessmentId} no longer fits this engine (${issue.path.map(String).join('.')}: ${issue.message}); re-run it and check against the new one`)
  }
  return { optionId: row.option_id, input: parsed.data }
}

/** Stores one record with the check the engine computed; returns its id. */
export async function storeCommissioningRecord(
  db: Kysely<Database>,
  args: { siteId: number; orgId: number; optionId: number; userId: number | null; input: CommissioningInput; result: CommissioningResult; engineVersion: string },
): Promise<number> {
  const i = args.input
  const row = await db
    .insertInto('commissioning_records')
    .values({
      site_id: args.siteId, org_id: args.orgId, option_id: args.optionId, assessment_id: i.assessmentId,
      measured_at: i.measuredAt, measured_by: i.measuredBy, entered_by: args.userId,
      river_flow_m3s: i.riverFlow_m3s, water_temp_c: i.waterTemp_C,
      manometer_fluid: i.manometerFluid, manometer_density_kgm3: i.manometerDensity_kgm3, reading_m: i.reading_m, reading_unit: i.readingUnit,
      upstream_tap_diameter_m: i.upstreamTapDiameter_m, discharge_coefficient: i.dischargeCoefficient,
      upstream_oxygen_mgl: i.upstreamOxygen_mgL, downstream_oxygen_mgl: i.downstreamOxygen_mgL, oxygen_measured_at: i.oxygenMeasuredAt,
      notes: i.notes,
      flow_verdict: args.result.flowVerdict.kind, oxygen_verdict: args.result.oxygenVerdict.kind,
      result_json: JSON.stringify(args.result), engine_version: args.engineVersion,
    })
    .returning('id')
    .executeTakeFirstOrThrow()
  return row.id
}

type ListedRow = CommissioningRecordRow & { option_name: string | null; entered_by_name: string | null }

function recordDto(r: ListedRow): CommissioningRecordDto {
  return {
    id: r.id, siteId: r.site_id, optionId: r.option_id, optionName: r.option_name, assessmentId: r.assessment_id,
    measuredAt: r.measured_at, measuredBy: r.measured_by,
    enteredBy: r.entered_by !== null && r.entered_by_name ? { id: r.entered_by, name: r.entered_by_name } : null,
    riverFlow_m3s: r.river_flow_m3s, waterTemp_C: r.water_temp_c,
    manometerFluid: r.manometer_fluid as ManometerFluid, manometerDensity_kgm3: r.manometer_density_kgm3,
    reading_m: r.reading_m, readingUnit: r.reading_unit as ReadingUnit,
    upstreamTapDiameter_m: r.upstream_tap_diameter_m, dischargeCoefficient: r.discharge_coefficient,
    upstreamOxygen_mgL: r.upstream_oxygen_mgl, downstreamOxygen_mgL: r.downstream_oxygen_mgl, oxygenMeasuredAt: r.oxygen_measured_at as OxygenPoint,
    notes: r.notes, result: JSON.parse(r.result_json) as CommissioningResult, engineVersion: r.engine_version, createdAt: r.created_at,
  }
}

function liveRecords(db: Kysely<Database>, siteId: number) {
  return db
    .selectFrom('commissioning_records')
    .leftJoin('options', 'options.id', 'commissioning_records.option_id')
    .leftJoin('users', 'users.id', 'commissioning_records.entered_by')
    .selectAll('commissioning_records')
    .select(['options.name as option_name', 'users.name as entered_by_name'])
    .where('commissioning_records.site_id', '=', siteId)
    .where('commissioning_records.deleted_at', 'is', null)
    .orderBy('commissioning_records.measured_at', 'desc')
    .orderBy('commissioning_records.id', 'desc')
}

/** One stored record as the API shows it. */
export async function commissioningRecordDto(db: Kysely<Database>, siteId: number, recordId: number): Promise<CommissioningRecordDto | undefined> {
  const row = await liveRecords(db, siteId).where('commissioning_records.id', '=', recordId).executeTakeFirst()
  return row && recordDto(row)
}

/** The site's live records, newest measurement first, and the assessments of its live options to check against. */
export async function listCommissioning(db: Kysely<Database>, siteId: number): Promise<CommissioningListDto> {
  const [rows, bases] = await Promise.all([
    liveRecords(db, siteId).execute(),
    db
      .selectFrom('assessments')
      .innerJoin('options', 'options.id', 'assessments.option_id')
      .innerJoin('assessment_payloads', 'assessment_payloads.assessment_id', 'assessments.id')
      .select([
        'assessments.id', 'assessments.option_id', 'options.name as option_name', 'assessments.created_at', 'assessments.engine_version',
        sql<string>`json_extract(assessment_payloads.input_json, '$.option')`.as('option_json'),
        sql<number>`json_extract(assessment_payloads.input_json, '$.site.altitude_m')`.as('altitude_m'),
        sql<number | null>`json_extract(assessment_payloads.input_json, '$.site.salinity_gkg')`.as('salinity_gkg'),
      ])
      .where('assessments.site_id', '=', siteId)
      .where('options.deleted_at', 'is', null)
      .orderBy('assessments.id', 'desc')
      .limit(MAX_BASES)
      .execute(),
  ])
  const assessments: CommissioningBasisDto[] = bases.map((b) => {
    const option = JSON.parse(b.option_json) as AssessInput['option']
    return {
      assessmentId: b.id, optionId: b.option_id, optionName: b.option_name, createdAt: b.created_at, engineVersion: b.engine_version,
      units: option.units, throatDiameter_m: option.throatDiameter_m, dischargeCoefficient: optionDischargeCoefficient(option),
      altitude_m: b.altitude_m, salinity_gkg: b.salinity_gkg ?? 0,
    }
  })
  return { records: rows.map(recordDto), assessments }
}

/** The site's latest measurement in a line (the reviewer's brief, the landowner summary); null without one. */
export async function latestCommissioningLine(db: Kysely<Database>, siteId: number): Promise<CommissioningLine | null> {
  const row = await liveRecords(db, siteId).limit(1).executeTakeFirst()
  if (!row) return null
  const result = JSON.parse(row.result_json) as CommissioningResult
  return {
    measuredAt: row.measured_at, measuredBy: row.measured_by, flow: result.flowVerdict, oxygen: result.oxygenVerdict,
    sentence: commissioningSentence(row.measured_at, result.flowVerdict, result.oxygenVerdict),
  }
}

/** The live record with this id; undefined when there is none or it was deleted. */
export async function liveCommissioningRecordById(db: Kysely<Database>, recordId: number): Promise<CommissioningRecordRow | undefined> {
  return db.selectFrom('commissioning_records').selectAll().where('id', '=', recordId).where('deleted_at', 'is', null).executeTakeFirst()
}

/** Marks a record deleted; the row stays as the record of what was measured and by whom. */
export async function deleteCommissioningRecord(db: Kysely<Database>, recordId: number, userId: number, now: string): Promise<void> {
  await db.updateTable('commissioning_records').set({ deleted_at: now, deleted_by: userId }).where('id', '=', recordId).execute()
}
