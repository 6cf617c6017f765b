import { sql, type Kysely, type RawBuilder } from 'kysely'

// The API names quantities with the unit after an underscore (`grossHead_m`, not `grossHeadM`), and
// some JSON columns hold objects in the API's own shape: this renames their keys so stored sites,
// options and assessments read as the API now writes them. Values are left exactly as they were.
//
// The rename is a text replace of `"old":` by `"new":` on JSON written by JSON.stringify (no spaces).
// It cannot touch a string value: a quote inside a JSON string is written `\"`, so `"old":` only
// ever matches a key. The two `defaultsUsed` entries name an input path as a value, so they are
// replaced as whole quoted strings. Names are written out here, not imported: a migration never
// changes once shipped.

type Pair = readonly [old: string, new: string]

const KEYS: Record<string, Record<string, readonly Pair[]>> = {
  sites: {
    weir: [['grossHeadM', 'grossHead_m'], ['crestWidthM', 'crestWidth_m']],
    months: [['waterTempC', 'waterTemp_C']],
    catchment: [['siteAreaKm2', 'siteArea_km2'], ['gaugeAreaKm2', 'gaugeArea_km2']],
  },
  options: {
    design: [['costPerKw', 'ratedPowerPrice']],
    settings: [['lifeYears', 'life_yr']],
  },
  assessment_payloads: {
    input_json: [['costPerKw', 'ratedPowerPrice'], ['lifeYears', 'life_yr']],
    result_json: [
      ['fullLoadHours', 'annualFullLoad_h'],
      ['opexPerYear', 'annualOpex'],
      ['revenuePerYear', 'annualRevenue'],
      ['simplePaybackYears', 'simplePayback_yr'],
      ['carbonAvoidedT', 'annualCarbonAvoided_t'],
    ],
  },
}

/** Input paths the stored results list as values (`defaultsUsed[].field`). */
const RESULT_VALUES: readonly Pair[] = [
  ['option.costs.costPerKw', 'option.costs.ratedPowerPrice'],
  ['settings.lifeYears', 'settings.life_yr'],
]

/** `column` with every `"from":` replaced by `"to":` (and each value pair as a whole quoted string). */
function renamed(column: string, keys: readonly Pair[], values: readonly Pair[], back: boolean): RawBuilder<unknown> {
  let expr: RawBuilder<unknown> = sql`${sql.ref(column)}`
  for (const [oldName, newName] of keys) {
    const [from, to] = back ? [newName, oldName] : [oldName, newName]
    expr = sql`replace(${expr}, ${`"${from}":`}, ${`"${to}":`})`
  }
  for (const [oldValue, newValue] of values) {
    const [from, to] = back ? [newValue, oldValue] : [oldValue, newValue]
    expr = sql`replace(${expr}, ${`"${from}"`}, ${`"${to}"`})`
  }
  return expr
}

async function renameAll(db: Kysely<unknown>, back: boolean): Promise<void> {
  for (const [table, columns] of Object.entries(KEYS)) {
    const sets = Object.entries(columns).map(([column, keys]) =>
      sql`${sql.ref(column)} = ${renamed(column, keys, column === 'result_json' ? RESULT_VALUES : [], back)}`,
    )
    await sql`update ${sql.table(table)} set ${sql.join(sets)}`.execute(db)
  }
}

export async function up(db: Kysely<unknown>): Promise<void> {
  await renameAll(db, false)
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await renameAll(db, true)
}
