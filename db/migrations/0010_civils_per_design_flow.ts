import { sql, type Kysely } from 'kysely'

// Civil works were priced per venturi unit (`civilsPerUnit`); they are now priced per m³/s of the
// scheme's design flow (`civilsPerDesignFlow`), because intake, channel and weir works follow the
// water handled. Stored option costs and the stored inputs of past assessments are rewritten:
// - a value still at the old illustrative default (40,000 per unit) moves to the new default
//   (78,000 per m³/s, worked from the LGA's low-head costs);
// - any other value keeps the option's civil cost as it was: civils per unit ÷ one unit's capacity
//   at the site's gross head (so units × per unit = per m³/s × units × capacity).
// A unit that passes no water at the gross head gets the new default. The hydraulics below are the
// engine's unit capacity as it stood when this was written, copied so the migration never changes.

const OLD_DEFAULT = 40_000
const NEW_DEFAULT = 78_000
const G = 9.80665

/** Inlet loss, diffuser efficiency and flow coefficient the engine assumed by constriction type. */
const CONSTRICTION: Record<string, { diffuserEfficiency: number; flowCoefficient: number }> = {
  'venturi': { diffuserEfficiency: 0.88, flowCoefficient: 0.98 },
  'short-nozzle': { diffuserEfficiency: 0.4, flowCoefficient: 0.96 },
  'sharp-plate': { diffuserEfficiency: 0, flowCoefficient: 0.61 },
}
const INLET_LOSS = 0.04

type Json = Record<string, unknown>
const num = (x: unknown, fallback: number): number => (typeof x === 'number' && Number.isFinite(x) ? x : fallback)

/** One unit's capacity Q = C·A_t·√(2gH/K), K = k_in + (1 − η_d)(1 − r²) + r², r = (d_t/d_o)² capped at 1, m³/s. */
function unitCapacity(design: Json, head_m: number): number {
  const base = CONSTRICTION[String(design.constriction ?? 'venturi')] ?? CONSTRICTION.venturi!
  const dt = num(design.throatDiameter_m, 0)
  const doo = num(design.outletDiameter_m, 0)
  const r = doo > 0 ? Math.min(1, (dt / doo) ** 2) : 1
  const eta = num(design.diffuserEfficiency, base.diffuserEfficiency)
  const K = num(design.inletLoss, INLET_LOSS) + (1 - eta) * (1 - r * r) + r * r
  const C = num(design.flowCoefficient, base.flowCoefficient)
  if (!(head_m > 0) || !(K > 0) || !(dt > 0)) return 0
  return C * (Math.PI * dt * dt / 4) * Math.sqrt((2 * G * head_m) / K)
}

/** The new civils price for an old one, as above. */
function perDesignFlow(perUnit: number, design: Json, head_m: number): number {
  if (perUnit === OLD_DEFAULT) return NEW_DEFAULT
  const q = unitCapacity(design, head_m)
  return q > 0 ? Math.round(perUnit / q) : NEW_DEFAULT
}

/** The old civils price for a new one (undoing the above). */
function perUnit(perFlow: number, design: Json, head_m: number): number {
  if (perFlow === NEW_DEFAULT) return OLD_DEFAULT
  const q = unitCapacity(design, head_m)
  return q > 0 ? Math.round(perFlow * q) : OLD_DEFAULT
}

interface Db {
  options: { id: number; site_id: number; design: string }
  sites: { id: number; gross_head_m: number }
  assessment_payloads: { assessment_id: number; input_json: string }
}

async function rewrite(raw: Kysely<unknown>, back: boolean): Promise<void> {
  const db = raw as unknown as Kysely<Db>
  const [from, to] = back ? ['civilsPerDesignFlow', 'civilsPerUnit'] : ['civilsPerUnit', 'civilsPerDesignFlow']
  const convert = back ? perUnit : perDesignFlow
  const options = await db.selectFrom('options').innerJoin('sites', 'sites.id', 'options.site_id')
    .select(['options.id', 'options.design', 'sites.gross_head_m']).execute()
  for (const r of options) {
    const design = JSON.parse(r.design) as Json
    const costs = design.costs as Json | undefined
    if (!costs || typeof costs[from] !== 'number') continue
    const { [from]: old, ...rest } = costs
    design.costs = { ...rest, [to]: convert(old as number, design, r.gross_head_m) }
    await db.updateTable('options').set({ design: JSON.stringify(design) }).where('id', '=', r.id).execute()
  }
  // Stored inputs may hold a long daily record: only the option and the head are read, and the
  // change is made in place by SQLite's JSON functions.
  const payloads = await db.selectFrom('assessment_payloads').select([
    'assessment_id',
    sql<string | null>`json_extract(input_json, '$.option')`.as('option'),
    sql<number | null>`json_extract(input_json, '$.site.grossHead_m')`.as('head'),
  ]).execute()
  for (const p of payloads) {
    const design = p.option === null ? null : JSON.parse(p.option) as Json
    const costs = design?.costs as Json | undefined
    if (!design || !costs || typeof costs[from] !== 'number') continue
    const value = convert(costs[from] as number, design, p.head ?? 0)
    await db.updateTable('assessment_payloads')
      .set({ input_json: sql`json_set(json_remove(input_json, ${`$.option.costs.${from}`}), ${`$.option.costs.${to}`}, ${value})` })
      .where('assessment_id', '=', p.assessment_id).execute()
  }
}

export async function up(db: Kysely<unknown>): Promise<void> {
  await rewrite(db, false)
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await rewrite(db, true)
}
