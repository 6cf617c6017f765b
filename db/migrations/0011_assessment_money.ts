import { sql, type Kysely } from 'kysely'

// The portfolio and the comparison show each assessment's capital cost and NPV beside its LCOE, and
// sort by them, so they become columns of `assessments` like the other headline figures. Stored runs
// get theirs from their stored result (every engine so far wrote `money.capex` and `money.npv`).
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('assessments').addColumn('capex', 'real').execute()
  await db.schema.alterTable('assessments').addColumn('npv', 'real').execute()
  await sql`update assessments set
    capex = (select json_extract(p.result_json, '$.money.capex') from assessment_payloads p where p.assessment_id = assessments.id),
    npv = (select json_extract(p.result_json, '$.money.npv') from assessment_payloads p where p.assessment_id = assessments.id)`.execute(db)
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.alterTable('assessments').dropColumn('npv').execute()
  await db.schema.alterTable('assessments').dropColumn('capex').execute()
}
