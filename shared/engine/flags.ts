// The flags an assessment raises or clears, judged over the whole year (year.ts), each with its share
// of time, its worst value and when, and its reason in plain words either way.
import type { AnnualEnergy } from './energy'
import type { MoneySummary } from './money'
import type { UncertaintyResult } from './monteCarlo'
import type { Flag, FlagId, FlagLevel, FlagWorst } from './results'
import type { PowerState, Scheme } from './scheme'
import type { YearJudgement } from './year'

/** A net oxygen change smaller than this, mg/L, counts as none (rounding, not a loss). */
export const NET_LOSS_TOLERANCE_mgL = 0.01

const fmt = (x: number, digits = 2): string => x.toFixed(digits)
const pct = (share: number): string => (share > 0 && share < 0.005 ? 'under 1 %' : `${(share * 100).toFixed(0)} %`)
const when = (w: FlagWorst): string => `${fmt(w.flow_m3s)} m³/s in ${w.monthName} (a flow exceeded ${w.exceedance.toFixed(1)} % of that month)`

/** Why the units make no energy, in plain words. */
function neverRunsReason(s: Scheme, grid: PowerState[]): string {
  const running = grid.filter((g) => g.unitsRunning > 0)
  const o = s.input.option
  if (!(s.input.site.grossHead_m > 0) && s.input.site.headTable.every((p) => !(p.head_m > 0))) return 'The site has no head, so no water can be driven through the units.'
  if (running.length > 0) return 'Air flows, but the units make no energy over the year.'
  const reasons = new Set(grid.map((g) => g.shutReason))
  if (o.operation.closedMonths.length === 12) return 'Every month is closed by the operating rule, so the units never run.'
  if (reasons.has('no-suction')) {
    return `The throat is ${fmt(o.throatDepth_m)} m below the tail pool and the diffuser does not recover enough head to pull it below atmospheric pressure, so the units would draw no air and stay shut. Raise the throat or use a better diffuser.`
  }
  if (reasons.has('below-cut-in')) return 'Air would flow, but the turbine never reaches its cut-in power, so the units stay shut.'
  if (reasons.has('river-first')) return 'Running the units would always cost the river more oxygen than is acceptable, so river-first operation keeps them shut.'
  const r = s.flowRules
  if (r.beyondHandsOff) {
    const rules = [
      `the hands-off flow (${fmt(r.handsOff_m3s, 3)} m³/s)`,
      ...(r.pass_m3s > 0 ? [`the pass flow (${fmt(r.pass_m3s, 3)} m³/s)`] : []),
      ...(r.keptShare > 0 ? [`the ${fmt(r.keptShare * 100, 0)} % of the flow above them that stays in the river`] : []),
      ...(r.maxTake_m3s < Infinity ? [`the maximum take (${fmt(r.maxTake_m3s, 3)} m³/s)`] : []),
    ]
    return `The flow rules never let the scheme take enough water to feed one unit at the head-pool level, so the units never start: ${rules.join(', ')}.`
  }
  return `The river never carries enough water beyond the reserved flow (${fmt(s.reserved_m3s, 3)} m³/s) to feed one unit at the head-pool level, so the units never start.`
}

/** What buildFlags needs. */
export interface FlagContext {
  s: Scheme
  year: YearJudgement
  energy: AnnualEnergy
  /** Power states at the year's mean conditions over the annual curve, for the never-runs reason (asked only when the units never run). */
  grid: () => PowerState[]
}

function flag(id: FlagId, level: FlagLevel, raised: boolean, shareOfTime: number | null, worst: FlagWorst | null, reason: string): Flag {
  return { id, raised, level, safety: level === 'safety', shareOfTime, worst, reason }
}

/** The six flags, from the whole-year judgement. */
export function buildFlags(c: FlagContext): Flag[] {
  const st = c.s.input.settings
  const y = c.year
  const t = y.tallies
  const never = !(c.energy.annualEnergy_MWh > 0)
  const flags: Flag[] = []

  const cav = t['cavitation']
  const thr = st.minCavitationMargin_m
  flags.push(flag('cavitation', 'safety', cav.share > 0, cav.worst ? cav.share : null, cav.worst,
    cav.worst === null
      ? 'The units never run, so the throat never sees suction.'
      : cav.share > 0
        ? `For ${pct(cav.share)} of the year the throat would hold so much suction with the air valve shut that fewer than ${fmt(thr)} m (common practice) are left before the water boils; worst ${fmt(cav.worst.value)} m at ${when(cav.worst)}. The throat can cavitate: set it deeper or lower the head it works on.`
        : `The smallest cavitation margin is ${fmt(cav.worst.value)} m (at ${when(cav.worst)}), above the ${fmt(thr)} m kept as a minimum.`))

  const tdg = t['gas-supersaturation']
  flags.push(flag('gas-supersaturation', 'safety', tdg.share > 0, tdg.worst ? tdg.share : null, tdg.worst,
    tdg.worst === null
      ? 'The units never run, so they add no dissolved gas.'
      : tdg.share > 0
        ? `For ${pct(tdg.share)} of the year water leaving the units carries more dissolved gas than ${fmt(st.tdgLimit * 100, 0)} % of saturation or ${fmt(st.tdgExcessLimit_mmHg, 0)} mmHg above the air's pressure (whichever is stricter); worst ${fmt(tdg.worst.value, 0)} % at ${when(tdg.worst)}, up to ${fmt(y.maxGasExcess_mmHg, 0)} mmHg. Air forced into water under pressure can give fish gas-bubble disease: set the throat shallower or take less air.`
        : `Water leaving the units carries at most ${fmt(tdg.worst.value, 0)} % total dissolved gas (at ${when(tdg.worst)}) and ${fmt(y.maxGasExcess_mmHg, 0)} mmHg above the air's pressure, within the ${fmt(st.tdgLimit * 100, 0)} % and ${fmt(st.tdgExcessLimit_mmHg, 0)} mmHg limits.`))

  const pushed = t['scheme-below-target']
  flags.push(flag('scheme-below-target', 'safety', pushed.share > 0, pushed.share, pushed.worst,
    pushed.share > 0 && pushed.worst
      ? `For ${pct(pushed.share)} of the year the scheme pushes or keeps the river below the ${fmt(st.oxygenTarget_mgL, 1)} mg/L target by taking oxygen it would otherwise get at the weir; lowest ${fmt(pushed.worst.value)} mg/L at ${when(pushed.worst)}. Run the units river first, close the months concerned, or change the design.`
      : `The scheme never pushes or keeps the river below the ${fmt(st.oxygenTarget_mgL, 1)} mg/L target.`))

  const loss = t['net-oxygen-loss']
  const acceptable = st.acceptableOxygenLoss_mgL
  flags.push(flag('net-oxygen-loss', 'river', loss.share > 0, loss.share, loss.worst,
    loss.share > 0 && loss.worst
      ? `For ${pct(loss.share)} of the year the river below the weir carries more than ${fmt(acceptable)} mg/L less oxygen with the scheme than without it (worst ${fmt(loss.worst.value)} mg/L at ${when(loss.worst)}): water taken through the units misses the aeration it gets falling over the weir, and the units do not give it all back.`
      : `The scheme never costs the river more than the acceptable ${fmt(acceptable)} mg/L of oxygen${loss.worst ? ` (worst change ${loss.worst.value >= 0 ? '+' : ''}${fmt(loss.worst.value)} mg/L, at ${when(loss.worst)})` : ''}.`))

  const below = t['oxygen-below-target']
  flags.push(flag('oxygen-below-target', 'note', below.share > 0, below.share, below.worst,
    below.share > 0 && below.worst
      ? `For ${pct(below.share)} of the year the river below the weir is under the ${fmt(st.oxygenTarget_mgL, 1)} mg/L target, scheme or not; lowest ${fmt(below.worst.value)} mg/L at ${when(below.worst)}.`
      : `Below the weir the river meets the ${fmt(st.oxygenTarget_mgL, 1)} mg/L target all year${below.worst ? ` (lowest ${fmt(below.worst.value)} mg/L, at ${when(below.worst)})` : ''}.`))

  flags.push(flag('never-runs', 'note', never, null, null,
    never ? neverRunsReason(c.s, c.grid()) : `The units run ${pct(y.runningShare)} of the year and make ${fmt(c.energy.annualEnergy_MWh, 1)} MWh in an average year.`))
  return flags
}

/** Whole currency units with thousands separators and a true minus sign (the engine names no currency). */
const amount = (x: number): string => `${x < 0 ? '−' : ''}${Math.round(Math.abs(x)).toLocaleString('en-GB')}`

/**
 * The money flag: raised when the scheme does not pay at the export price (revenue below the
 * operating cost, or NPV below zero), with the break-even price. Judged on the central energy figure.
 */
export function moneyFlag(m: MoneySummary, exportPrice: number): Flag {
  const needs = m.breakEvenPrice === null ? 'it makes no energy, so no price would make it pay' : `it would need ${amount(m.breakEvenPrice)} per MWh to break even`
  const parts: string[] = []
  if (m.shortfalls.includes('revenue-below-opex')) parts.push(`revenue ${amount(m.annualRevenue)} a year is below the operating cost ${amount(m.annualOpex)} a year`)
  if (m.shortfalls.includes('negative-npv')) parts.push(`NPV ${amount(m.npv)} at ${amount(exportPrice)} per MWh`)
  return flag('does-not-pay', 'money', !m.pays, null, null,
    m.pays
      ? `Pays at ${amount(exportPrice)} per MWh: NPV ${amount(m.npv)}; it breaks even at ${amount(m.breakEvenPrice ?? 0)} per MWh.`
      : `Does not pay: ${parts.join('; ')}; ${needs}.`)
}

/**
 * The does-not-pay flag once the Monte Carlo has run: raised also when the central figures pay but
 * the median draw does not (NPV below zero at P50).
 */
export function withMoneyAtP50(flags: Flag[], uncertainty: UncertaintyResult | null): Flag[] {
  const p50 = uncertainty?.npv.p50 ?? null
  if (p50 === null || !(p50 < 0)) return flags
  return flags.map((f) => (f.id !== 'does-not-pay' || f.raised ? f : {
    ...f, raised: true,
    reason: `Does not pay at P50: the central figures pay, but half of the ${uncertainty!.draws} draws of the uncertain inputs give an NPV below ${amount(p50)}. ${f.reason}`,
  }))
}
