import { sql, type Kysely } from 'kysely'

// The portfolio, the comparison and the reviewer's brief show how sure each assessment's energy and
// oxygen figures are beside the headline ones, and the portfolio sorts by the P90 energy, so these
// become columns of `assessments`: the Monte Carlo's P50 and P90 annual energy (exceeded in half and
// in nine of ten draws), its chance of a net oxygen loss in the worst month, and the daily record's
// P90 year. Stored runs get theirs from their stored result; a run stored before the Monte Carlo or
// the year-by-year figures existed, or one that had none (an entered curve, no draws), keeps nulls.
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('assessments').addColumn('energy_p50_mwh', 'real').execute()
  await db.schema.alterTable('assessments').addColumn('energy_p90_mwh', 'real').execute()
  await db.schema.alterTable('assessments').addColumn('net_loss_probability', 'real').execute()
  await db.schema.alterTable('assessments').addColumn('record_p90_mwh', 'real').execute()
  await sql`update assessments set
    energy_p50_mwh = (select json_extract(p.result_json, '$.uncertainty.energy_MWh.p50') from assessment_payloads p where p.assessment_id = assessments.id),
    energy_p90_mwh = (select json_extract(p.result_json, '$.uncertainty.energy_MWh.p90') from assessment_payloads p where p.assessment_id = assessments.id),
    net_loss_probability = (select json_extract(p.result_json, '$.uncertainty.netLossProbability') from assessment_payloads p where p.assessment_id = assessments.id),
    record_p90_mwh = (select json_extract(p.result_json, '$.years.p90Energy_MWh') from assessment_payloads p where p.assessment_id = assessments.id)`.execute(db)
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('assessments').dropColumn('record_p90_mwh').execute()
  await db.schema.alterTable('assessments').dropColumn('net_loss_probability').execute()
  await db.schema.alterTable('assessments').dropColumn('energy_p90_mwh').execute()
  await db.schema.alterTable('assessments').dropColumn('energy_p50_mwh').execute()
}
