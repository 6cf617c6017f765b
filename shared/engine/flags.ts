// The flags an assessment raises or clears, each with its reason in plain words either way.
import type { AnnualEnergy } from './energy'
import type { MonthRow, Flag, SummerLowFlow } from './results'
import type { PowerState, Scheme } from './scheme'

/** A net oxygen change smaller than this, mg/L, counts as none (rounding, not a loss). */
export const NET_LOSS_TOLERANCE_mgL = 0.01

const fmt = (x: number, digits = 2): string => x.toFixed(digits)

/** Why the units make no energy, in plain words. */
function neverRunsReason(s: Scheme, grid: PowerState[]): string {
  const running = grid.filter((g) => g.unitsRunning > 0)
  if (!(s.input.site.grossHead_m > 0) && s.input.site.headTable.every((p) => !(p.head_m > 0))) return 'The site has no head, so no water can be driven through the units.'
  if (running.length === 0) return `The river never carries more than the reserved flow (${fmt(s.reserved_m3s, 3)} m³/s) plus the minimum flow a unit needs, so the units never start.`
  if (running.every((g) => g.suction_m <= 0)) {
    const best = Math.max(...running.map((g) => g.suction_m + s.input.option.throatDepth_m))
    return `The throat is ${fmt(s.input.option.throatDepth_m)} m below the tail pool but the diffuser recovers at most ${fmt(best)} m of head, so the throat never drops below atmospheric pressure and draws no air. Raise the throat or use a better diffuser.`
  }
  if (running.every((g) => g.electricalPower_W === 0)) return 'Air flows, but the turbine never reaches its cut-in power, so no electricity is made.'
  return 'The units make no energy over the flow-duration curve.'
}

/** A state where units run, with the total dissolved gas of their discharge. */
export interface Running {
  state: PowerState
  tdg: number
}

export interface FlagContext {
  s: Scheme
  worst: PowerState | null
  tdgWorst: Running | null
  maxTdg: number
  months: MonthRow[]
  slfGain: number
  slf: SummerLowFlow
  energy: AnnualEnergy
  grid: PowerState[]
}

export function buildFlags(c: FlagContext): Flag[] {
  const st = c.s.input.settings
  const thr = st.minCavitationMargin_m
  const flags: Flag[] = []

  if (c.worst === null) {
    flags.push({ id: 'cavitation', raised: false, safety: true, reason: 'The units never run, so the throat never sees suction.' })
  } else {
    const w = c.worst
    const raised = w.cavitationMargin_m < thr
    flags.push({
      id: 'cavitation', raised, safety: true,
      reason: raised
        ? `At ${fmt(w.riverFlow_m3s)} m³/s river flow the throat would hold ${fmt(w.suction_m)} m of suction with the air valve shut, leaving only ${fmt(w.cavitationMargin_m)} m before the water boils (keep at least ${fmt(thr)} m, common practice). The throat can cavitate: set it deeper or lower the head it works on.`
        : `The smallest cavitation margin is ${fmt(w.cavitationMargin_m)} m (at ${fmt(w.riverFlow_m3s)} m³/s), above the ${fmt(thr)} m kept as a minimum.`,
    })
  }

  const tdgRaised = c.maxTdg > st.tdgLimit
  flags.push({
    id: 'gas-supersaturation', raised: tdgRaised, safety: true,
    reason: c.tdgWorst === null
      ? 'The units never run, so they add no dissolved gas.'
      : tdgRaised
        ? `Water leaving the units could carry ${fmt(c.maxTdg * 100, 0)} % total dissolved gas (at ${fmt(c.tdgWorst.state.riverFlow_m3s)} m³/s), above the ${fmt(st.tdgLimit * 100, 0)} % limit. Air forced into water under pressure can give fish gas-bubble disease: set the throat shallower or take less air.`
        : `Water leaving the units carries at most ${fmt(c.maxTdg * 100, 0)} % total dissolved gas, within the ${fmt(st.tdgLimit * 100, 0)} % limit.`,
  })

  const below = c.months.filter((m) => m.flags.includes('oxygen-below-target'))
  flags.push({
    id: 'oxygen-below-target', raised: below.length > 0, safety: false,
    reason: below.length > 0
      ? `Below the weir the river stays under the ${fmt(st.oxygenTarget_mgL, 1)} mg/L target in ${below.map((m) => m.name).join(', ')}, even with the scheme.`
      : `Below the weir the river meets the ${fmt(st.oxygenTarget_mgL, 1)} mg/L target in every month.`,
  })

  const losing = c.months.filter((m) => m.flags.includes('net-oxygen-loss'))
  const slfLoss = c.slfGain < -NET_LOSS_TOLERANCE_mgL
  const lossRaised = losing.length > 0 || slfLoss
  const worstLoss = Math.min(c.slfGain, ...c.months.map((m) => m.netGain_mgL))
  flags.push({
    id: 'net-oxygen-loss', raised: lossRaised, safety: true,
    reason: lossRaised
      ? `With the scheme the river would carry less oxygen than without it (down to ${fmt(worstLoss)} mg/L${losing.length ? ` in ${losing.map((m) => m.name).join(', ')}` : ' at summer low flow'}): water taken through the units misses the aeration it gets falling over the weir, and the units do not give it back.`
      : `The scheme never leaves the river with less oxygen than the weir alone gives (summer low flow: ${c.slfGain >= 0 ? '+' : ''}${fmt(c.slfGain)} mg/L).`,
  })

  const never = !(c.energy.annualEnergy_MWh > 0)
  flags.push({
    id: 'head-limited-never-runs', raised: never, safety: false,
    reason: never ? neverRunsReason(c.s, c.grid) : `The units make ${fmt(c.energy.annualEnergy_MWh, 1)} MWh in an average year.`,
  })
  return flags
}
