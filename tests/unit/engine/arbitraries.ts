// Random inputs the engine's property tests share: a site and option anywhere in the schema's bounds,
// in either operating mode (the operating-rule properties draw these; the baseline's add to them).
import fc from 'fast-check'
import { AssessInputSchema, type AssessInput, type AssessInputDraft } from '../../../shared/schemas/assess'
import { draft } from './fixtures'

/** A finite double in [min, max]. */
export const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true })

/** A random site and option in the schema's bounds, in either operating mode. */
export const operatingInputArb: fc.Arbitrary<AssessInput> = fc.record({
  grossHead: num(0.3, 5),
  units: fc.integer({ min: 1, max: 5 }),
  throat: num(0.2, 1.2),
  widen: num(1, 2.5),
  depth: num(0, 4),
  drawdown: fc.oneof(num(0, 0.5), fc.constant(0.05)),
  mode: fc.constantFrom('energy-first', 'river-first'),
  rated: fc.oneof(fc.constant(null), num(0.5, 100)),
  cutIn: num(0, 0.5),
  o2: fc.array(num(3, 13), { minLength: 12, maxLength: 12 }),
  temps: fc.array(num(1, 25), { minLength: 12, maxLength: 12 }),
  constriction: fc.constantFrom('venturi', 'short-nozzle', 'sharp-plate'),
  quality: fc.constantFrom('clean', 'moderately-polluted'),
}).map((r) => {
  const d: AssessInputDraft = draft()
  d.site = { ...d.site, grossHead_m: r.grossHead, waterQuality: r.quality, months: r.temps.map((t, i) => ({ temperature_C: t, upstreamOxygen_mgL: r.o2[i]! })) }
  d.option = {
    ...d.option, units: r.units, throatDiameter_m: r.throat, outletDiameter_m: r.throat * r.widen, throatDepth_m: r.depth, constriction: r.constriction,
    operation: { mode: r.mode, allowedDrawdown_m: r.drawdown },
    turbine: { ratedPower_kW: r.rated, cutInFraction: r.cutIn },
  }
  return AssessInputSchema.parse(d)
})
