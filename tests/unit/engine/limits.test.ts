// Engine inputs at their limits: every numeric input of an assessment, one at a time, set to zero,
// the smallest and largest doubles, negatives, and the strings a form or a hand-written body may send
// ("NaN", "Infinity", "1e999"). Each must either be refused naming that field (by the schema, or by
// the engine as an EngineInputError) or give a result whose every number is finite: a NaN or an
// Infinity would reach the browser as JSON null. No formula is checked here, only that none breaks.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { assess } from '../../../shared/engine/assess'
import { EngineInputError } from '../../../shared/engine/errors'
import { sensitivity } from '../../../shared/engine/sensitivity'
import { sweep } from '../../../shared/engine/sweep'
import { AssessInputSchema, type AssessInput, type AssessInputDraft } from '../../../shared/schemas/assess'
import { draft, fieldOf, numbersIn, setAt, yearOfDays } from './fixtures'

/** The values every numeric input is tried at. */
const LIMIT_VALUES: readonly unknown[] = [
  0, -0, Number.MIN_VALUE, 1e-300, 1e300, Number.MAX_VALUE, -1, -1e300, -Number.MAX_VALUE,
  NaN, Infinity, -Infinity, 'NaN', 'Infinity', '-Infinity', '1e999', '1', '', null,
]

/** The draft with every optional numeric input present, so each is tried. */
function fullFdc(): AssessInputDraft {
  const d = draft()
  d.site.headTable = [{ flow_m3s: 5, head_m: 2 }, { flow_m3s: 20, head_m: 1.6 }, { flow_m3s: 60, head_m: 1 }]
  d.gaugeScaling = { siteArea_km2: 40, gaugeArea_km2: 50 }
  d.option = { ...d.option, diffuserEfficiency: 0.8, flowCoefficient: 0.97, diffuserLength_m: 3, turbine: { ratedPower_kW: 20 } }
  return d
}

/** A daily record with a fixed reserved flow, month flows and the other oxygen method. */
function record(): AssessInputDraft {
  const d = draft()
  d.hydrology = { kind: 'record', days: yearOfDays((m) => (m === 3 ? null : 1 + m / 2)) }
  d.reservedFlow = { kind: 'fixed', flow: 0.3 }
  d.site.months = d.site.months.map((m, i) => ({ ...m, flow_m3s: 1 + i }))
  d.settings = { oxygenMethod: 'field-transfer', discountRate: 0 }
  return d
}

const BASES: [string, AssessInputDraft][] = [['fdc', fullFdc()], ['record', record()]]


/** Numeric inputs of a parsed base: every one, but of the 12 months only two and of the days only three. */
function numericInputs(parsed: AssessInput): string[] {
  return numbersIn(parsed)
    .map(([p]) => p)
    .filter((p) => !/months\[(?![06]\])/.test(p) && !/days\[(?!(0|40|364)\])/.test(p))
}

/** True when `refused` is `field`, or the same column of the row before or after (FDC points, head table). */
function namesField(refused: string, field: string): boolean {
  if (refused === field) return true
  const a = /^(.*)\.(\d+)\.(\w+)$/.exec(refused)
  const b = /^(.*)\.(\d+)\.(\w+)$/.exec(field)
  return !!a && !!b && a[1] === b[1] && a[3] === b[3] && Math.abs(Number(a[2]) - Number(b[2])) === 1
}

const nonFinite = (v: unknown) => numbersIn(v).filter(([, x]) => !Number.isFinite(x))

type Outcome = { kind: 'refused'; field: string } | { kind: 'engine-error'; field: string } | { kind: 'ran'; bad: [string, number][] }

/** Parse then run `compute` the way the routes do (schema, then engine). */
function attempt(input: unknown, compute: (i: AssessInput) => unknown): Outcome {
  const parsed = AssessInputSchema.safeParse(input)
  if (!parsed.success) return { kind: 'refused', field: parsed.error.issues[0]!.path.map(String).join('.') }
  try {
    return { kind: 'ran', bad: nonFinite(compute(parsed.data)) }
  } catch (error) {
    if (error instanceof EngineInputError) return { kind: 'engine-error', field: error.field }
    throw error
  }
}

describe('engine inputs at their limits', () => {
  for (const [name, base] of BASES) {
    const parsed = AssessInputSchema.parse(base)
    const paths = numericInputs(parsed)

    it(`${name}: the base input runs with only finite numbers`, () => {
      expect(paths.length).toBeGreaterThan(40)
      expect(nonFinite(assess(parsed))).toEqual([])
    })

    it(`${name}: each numeric input at zero, tiny, huge, negative, NaN or as text is refused naming it, or gives only finite numbers`, () => {
      const broken: string[] = []
      for (const path of paths) {
        for (const value of LIMIT_VALUES) {
          const outcome = attempt(setAt(parsed, path, value), assess)
          const label = `${fieldOf(path)} = ${typeof value === 'string' ? JSON.stringify(value) : String(value)}`
          if (outcome.kind === 'ran' && outcome.bad.length) broken.push(`${label}: ${outcome.bad.slice(0, 3).map(([p, x]) => `${p}=${x}`).join(', ')}`)
          // A refusal names the field that was changed, or for an ordering rule its neighbour in the same table.
          if (outcome.kind === 'refused' && !namesField(outcome.field, fieldOf(path))) broken.push(`${label}: refused naming ${outcome.field}`)
          if (outcome.kind === 'engine-error' && !outcome.field) broken.push(`${label}: engine error without a field`)
          // Values JSON cannot carry, and text, never get past the schema (null may: some inputs are nullable).
          if (typeof value === 'string' || (typeof value === 'number' && !Number.isFinite(value))) {
            if (outcome.kind !== 'refused') broken.push(`${label}: was not refused`)
          }
        }
      }
      expect(broken).toEqual([])
    }, 120_000) // a few hundred engine runs; the limit only keeps a hung run from stalling the suite
  }

  it('a sweep or a sensitivity run from an input at its limits gives only finite numbers, or names the field', () => {
    const base = AssessInputSchema.parse(BASES[0]![1])
    const paths = numericInputs(base)
    const finiteLimits = LIMIT_VALUES.filter((v): v is number => typeof v === 'number' && Number.isFinite(v))
    const grid = { throatDiameters_m: [0.3, 10], units: [1, 50], throatDepths_m: [0, 30] }
    fc.assert(
      fc.property(fc.constantFrom(...paths), fc.constantFrom(...finiteLimits), fc.constantFrom('sweep', 'sensitivity'), fc.constantFrom(0.01, 0.2, 0.9), (path, value, which, fraction) => {
        const outcome = attempt(setAt(base, path, value), (i) => (which === 'sweep' ? sweep(i, grid) : sensitivity(i, fraction)))
        if (outcome.kind === 'ran') expect(outcome.bad, `${which} ${fieldOf(path)} = ${value}`).toEqual([])
        else expect(outcome.field.length).toBeGreaterThan(0)
      }),
      { numRuns: 40 },
    )
  }, 120_000)

  // Inputs that once gave NaN or Infinity, kept as plain cases (through the schema, as the routes run them).
  const oneThroat = { throatDiameters_m: [0.3], units: [1], throatDepths_m: [1] }
  it.each<[string, string, number, (i: AssessInput) => unknown]>([
    ['a throat of the smallest double, swept', '$.option.throatDiameter_m', Number.MIN_VALUE, (i) => sweep(i, oneThroat)],
    ['a flow coefficient of the smallest double, in a sensitivity run', '$.option.flowCoefficient', Number.MIN_VALUE, (i) => sensitivity(i, 0.9)],
    ['a gross head of the smallest double', '$.site.grossHead_m', Number.MIN_VALUE, assess],
    ['a turbine efficiency of the smallest double', '$.option.turbine.efficiency', Number.MIN_VALUE, assess],
    ['an economic life of the smallest double', '$.settings.life_yr', Number.MIN_VALUE, assess],
    ['a gauge area of the smallest double', '$.gaugeScaling.gaugeArea_km2', Number.MIN_VALUE, assess],
    ['an FDC flow of the largest double', '$.hydrology.points.0.flow', Number.MAX_VALUE, assess],
    ['a fixed cost of the largest double', '$.option.costs.fixedCost', Number.MAX_VALUE, assess],
    ['an export price of the largest double', '$.settings.exportPrice', Number.MAX_VALUE, assess],
  ])('%s: finite numbers, or refused naming the field', (_, path, value, run) => {
    const outcome = attempt(setAt(AssessInputSchema.parse({ ...draft(), gaugeScaling: { siteArea_km2: 40, gaugeArea_km2: 50 } }), path.replace(/\.(\d+)\./g, '[$1].'), value), run)
    if (outcome.kind === 'ran') expect(outcome.bad).toEqual([])
    else expect(outcome.field).toBe(fieldOf(path.replace(/\.(\d+)\./g, '[$1].')))
  })
})
