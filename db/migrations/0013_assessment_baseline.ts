import { sql, type Kysely } from 'kysely'

// The portfolio shows each site's lead option beside a conventional turbine at the same weir, so the
// baseline's annual energy becomes a column of `assessments` like the scheme's. Stored runs get theirs
// from their stored result; a run stored before the baseline existed keeps a null.
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('assessments').addColumn('baseline_energy_mwh', 'real').execute()
  await sql`update assessments set
    baseline_energy_mwh = (select json_extract(p.result_json, '$.baseline.annualEnergy_MWh') from assessment_payloads p where p.assessment_id = assessments.id)`.execute(db)
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('assessments').dropColumn('baseline_energy_mwh').execute()
}
