// How sure a stored assessment's figures are, in the few numbers the reviewer's brief and the
// landowner summary show (the Monte Carlo's P90/P50 energy and chance of a net oxygen loss, the daily
// record's P90 year and driest year), read null-safe from a stored result, and the landowner's plain
// sentences made from them. One rounding rule for energy in words (`plainEnergy`), shared with the
// app's other plain lines, so a figure reads the same wherever it is said.
import type { AssessResult } from '../engine/results'

/** What the brief and the summary need to say how sure the figures are. */
export interface HowSure {
  /** False for a run stored by an engine before these figures (0.3.0): re-run it to see them. */
  stored: boolean
  /** The seeded Monte Carlo over the uncertain inputs; null when it was not run (no draws) or not stored. */
  monteCarlo: {
    draws: number
    /** Annual energy exceeded in nine of ten draws and in half of them, MWh/yr. */
    energyP90_MWh: number | null
    energyP50_MWh: number | null
    /** Share of draws (0–1) whose worst month loses more oxygen than the acceptable loss. */
    netLossProbability: number
    /** The acceptable loss the run used, mg/L; null when the stored input does not say. */
    acceptableOxygenLoss_mgL: number | null
  } | null
  /** The daily record's complete years; null for an entered curve, or when not stored. */
  record: {
    completeYears: number
    /** Annual energy exceeded in half the years, and in nine years of ten (null under 9 complete years), MWh. */
    p50Energy_MWh: number | null
    p90Energy_MWh: number | null
    /** The year of lowest mean flow: its energy and its worst month's net oxygen change. */
    driest: { year: number; energy_MWh: number; meanFlow_m3s: number; worstMonthName: string; worstMonthNetGain_mgL: number } | null
  } | null
}

/** The how-sure figures of a stored result, with the acceptable oxygen loss its input used. */
export function howSureOf(result: AssessResult, acceptableOxygenLoss_mgL: number | null): HowSure {
  // Results stored before engine 0.3.0 lack both keys; a newer one has each, null where not run.
  const mc = result.uncertainty
  const y = result.years
  const d = y?.driest ?? null
  return {
    stored: mc !== undefined && y !== undefined,
    monteCarlo: mc
      ? { draws: mc.draws, energyP90_MWh: mc.energy_MWh.p90, energyP50_MWh: mc.energy_MWh.p50, netLossProbability: mc.netLossProbability, acceptableOxygenLoss_mgL }
      : null,
    record: y
      ? {
          completeYears: y.years.length,
          p50Energy_MWh: y.p50Energy_MWh,
          p90Energy_MWh: y.p90Energy_MWh,
          driest: d && { year: d.year, energy_MWh: d.energy_MWh, meanFlow_m3s: d.meanFlow_m3s, worstMonthName: d.worstMonthName, worstMonthNetGain_mgL: d.worstMonthNetGain_mgL },
        }
      : null,
  }
}

/** A number to at most `digits` decimals with grouping, never "-0". */
function upTo(x: number, digits: number): string {
  const r = Math.round(x * 10 ** digits) / 10 ** digits + 0
  return r.toLocaleString('en-GB', { maximumFractionDigits: digits })
}

/** Energy in words with as many decimals as its size needs: 61, 4.2, 0.35 (the one rule for plain lines). */
export function plainEnergy(x: number): string {
  const a = Math.abs(x)
  return upTo(x, a >= 10 ? 0 : a >= 1 ? 1 : 2)
}

const gcd = (a: number, b: number): number => (b === 0 ? a : gcd(b, a % b))

/**
 * A share of draws (0 < p < 1) as a plain frequency, to the nearest tenth in lowest terms: "about 1
 * draw of 5", "3 draws of 10", "fewer than 1 draw of 20", "more than 19 draws of 20".
 */
export function drawsInWords(p: number): string {
  if (p < 0.05) return 'fewer than 1 draw of 20'
  if (p > 0.95) return 'more than 19 draws of 20'
  const tenths = Math.round(p * 10)
  const g = gcd(tenths, 10)
  const [k, n] = [tenths / g, 10 / g]
  return `${Math.abs(p * 10 - tenths) < 1e-9 ? '' : 'about '}${k} draw${k === 1 ? '' : 's'} of ${n}`
}

/** What "a net oxygen loss" means for the river, given the acceptable loss. */
function lossInWords(acceptable: number | null): string {
  return acceptable && acceptable > 0 ? `more than ${upTo(acceptable, 2)} mg/L of oxygen` : 'oxygen'
}

/**
 * The landowner's plain sentences: how much energy the scheme makes at least in nine years of ten (the
 * record's years, else the Monte Carlo's draws of an average year), and how often the river would lose
 * oxygen in its worst month over the draws. An older run says so; a run with neither figure says nothing.
 */
export function howSureSentences(h: HowSure): string[] {
  if (!h.stored) return ['How sure these figures are is not shown: they come from an older run of the assessment, made before it was worked out.']
  const out: string[] = []
  const r = h.record
  const mc = h.monteCarlo
  if (r && r.p90Energy_MWh !== null) {
    out.push(`In 9 years of 10 the scheme would make at least ${plainEnergy(r.p90Energy_MWh)} MWh, judged from the ${r.completeYears} complete years of the daily flow record.`)
  } else if (mc && mc.energyP90_MWh !== null) {
    out.push(`In 9 draws of 10 of the uncertain inputs, the scheme would make at least ${plainEnergy(mc.energyP90_MWh)} MWh in an average year.`)
  }
  if (mc && mc.draws > 0) {
    const p = mc.netLossProbability
    const loss = lossInWords(mc.acceptableOxygenLoss_mgL)
    if (!(p > 0)) out.push(`In none of the ${mc.draws} draws of the uncertain inputs would the river lose ${loss} in its worst month.`)
    else if (p >= 1) out.push(`In every draw of the uncertain inputs, the river would lose ${loss} in its worst month.`)
    else out.push(`In ${drawsInWords(p)} of the uncertain inputs, the river would lose ${loss} in its worst month.`)
  }
  return out
}
