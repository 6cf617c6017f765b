// Which defaults an assessment ran with, each with its origin, for the results page.
import type { AssessInput } from '../schemas/assess'
import { BASELINE_DEFAULTS, BASELINE_PRICE_PER_KW } from './baselineUnits'
import { DEFAULTS, DIFFUSER_EFFICIENCY, FLOW_COEFFICIENT, type SourcedValue } from './defaults'
import { HYDROLOGY_DEFAULTS } from './hydrology'
import { MONEY_DEFAULTS } from './money'
import { WATER_QUALITY_A, WEIR_SHAPE_B } from './oxygen'

/** One default in force in an assessment. */
export interface DefaultUsed extends SourcedValue {
  /** Input path, e.g. `option.air.jetPumpEfficiency`. */
  readonly field: string
}

/** List every input that equals its default (or was left out and defaulted), with value, unit and origin. */
export function defaultsUsed(input: AssessInput): DefaultUsed[] {
  const o = input.option
  const st = input.settings
  const out: DefaultUsed[] = []
  const check = (field: string, actual: number | undefined, def: SourcedValue): void => {
    if (actual === undefined || actual === def.value) out.push({ field, value: def.value, unit: def.unit, source: def.source })
  }
  check('option.inletLoss', o.inletLoss, DEFAULTS.inletLoss)
  check('option.diffuserEfficiency', o.diffuserEfficiency, DIFFUSER_EFFICIENCY[o.constriction])
  check('option.flowCoefficient', o.flowCoefficient, FLOW_COEFFICIENT[o.constriction])
  if (o.diffuserLength_m === undefined) check('settings.diffuserHalfAngle_deg', st.diffuserHalfAngle_deg, DEFAULTS.diffuserHalfAngle)
  check('option.operation.allowedDrawdown_m', o.operation.allowedDrawdown_m, DEFAULTS.allowedDrawdown)
  check('option.air.pipeLossK', o.air.pipeLossK, DEFAULTS.airPipeLossK)
  check('option.air.frictionFactor', o.air.frictionFactor, DEFAULTS.airPipeFrictionFactor)
  check('option.air.jetPumpEfficiency', o.air.jetPumpEfficiency, DEFAULTS.jetPumpEfficiency)
  check('option.air.maxGasLiquidRatio', o.air.maxGasLiquidRatio, DEFAULTS.maxGasLiquidRatio)
  check('option.turbine.efficiency', o.turbine.efficiency, DEFAULTS.turbineEfficiency)
  check('option.turbine.generatorEfficiency', o.turbine.generatorEfficiency, DEFAULTS.generatorEfficiency)
  check('option.turbine.cutInFraction', o.turbine.cutInFraction, DEFAULTS.turbineCutInFraction)
  check('option.costs.fixedCost', o.costs.fixedCost, MONEY_DEFAULTS.fixedCost)
  check('option.costs.ratedPowerPrice', o.costs.ratedPowerPrice, MONEY_DEFAULTS.ratedPowerPrice)
  check('option.costs.civilsPerDesignFlow', o.costs.civilsPerDesignFlow, MONEY_DEFAULTS.civilsPerDesignFlow)
  const bl = o.baseline
  if (bl) {
    check('option.baseline.headLossFraction', bl.headLossFraction, BASELINE_DEFAULTS.headLossFraction)
    check('option.baseline.generatorEfficiency', bl.generatorEfficiency, BASELINE_DEFAULTS.generatorEfficiency)
    if (bl.costs.ratedPowerPrice === null) check('option.baseline.costs.ratedPowerPrice', undefined, BASELINE_PRICE_PER_KW[bl.kind])
    check('option.baseline.costs.fixedCost', bl.costs.fixedCost, BASELINE_DEFAULTS.fixedCost)
  }
  check('site.salinity_gkg', input.site.salinity_gkg, DEFAULTS.salinity)
  const a = WATER_QUALITY_A[input.site.waterQuality]
  out.push({ field: 'site.waterQuality', value: a.value, unit: '-', source: `${a.label}: ${a.source}` })
  const b = WEIR_SHAPE_B[input.site.weirShape]
  out.push({ field: 'site.weirShape', value: b.value, unit: '-', source: `${b.label}: ${b.source}` })
  if (input.reservedFlow.kind === 'percentile') check('reservedFlow.exceedance', input.reservedFlow.exceedance, HYDROLOGY_DEFAULTS.reservedFlowExceedance)
  const settings: Array<[string, number, SourcedValue]> = [
    ['availability', st.availability, DEFAULTS.availability],
    ['minCavitationMargin_m', st.minCavitationMargin_m, DEFAULTS.minCavitationMargin],
    ['sotePerMetre', st.sotePerMetre, DEFAULTS.sotePerMetre],
    ['inDeviceTransfer', st.inDeviceTransfer, DEFAULTS.inDeviceTransfer],
    ['alpha', st.alpha, DEFAULTS.alpha],
    ['beta', st.beta, DEFAULTS.beta],
    ['theta', st.theta, DEFAULTS.theta],
    ['oxygenTarget_mgL', st.oxygenTarget_mgL, DEFAULTS.oxygenTarget],
    ['acceptableOxygenLoss_mgL', st.acceptableOxygenLoss_mgL, DEFAULTS.acceptableOxygenLoss],
    ['tdgLimit', st.tdgLimit, DEFAULTS.tdgLimit],
    ['tdgExcessLimit_mmHg', st.tdgExcessLimit_mmHg, DEFAULTS.tdgExcessLimit],
    ['upstreamNitrogenSaturation', st.upstreamNitrogenSaturation, DEFAULTS.upstreamNitrogenSaturation],
    ['bubbleDiameter_m', st.bubbleDiameter_m, DEFAULTS.bubbleDiameter],
    ['plumeVelocity_ms', st.plumeVelocity_ms, DEFAULTS.plumeVelocity],
    ['oxygenDiffusivity20', st.oxygenDiffusivity20, DEFAULTS.oxygenDiffusivity20],
    ['airTemperatureOffset_K', st.airTemperatureOffset_K, DEFAULTS.airTemperatureOffset],
    ['discountRate', st.discountRate, MONEY_DEFAULTS.discountRate],
    ['life_yr', st.life_yr, MONEY_DEFAULTS.life_yr],
    ['opexFraction', st.opexFraction, MONEY_DEFAULTS.opexFraction],
    ['exportPrice', st.exportPrice, MONEY_DEFAULTS.exportPrice],
    ['gridFactor', st.gridFactor, MONEY_DEFAULTS.gridFactor],
  ]
  for (const [k, val, def] of settings) check(`settings.${k}`, val, def)
  return out
}
