// The depleted reach and the flow rules in plain words, for the results page, the reviewer's brief
// and the landowner summary (one wording everywhere).
import type { DepletedReach } from '../engine/results'
import { FLOW_RULE_PRESET_LABEL } from './flowRulePresets'

const flow = (x: number): string => (x >= 10 ? x.toFixed(1) : x >= 0.1 ? x.toFixed(2) : x.toFixed(3))
const days = (d: number): string => (d > 0 && d < 0.5 ? 'under 1 day' : `${Math.round(d)} ${Math.round(d) === 1 ? 'day' : 'days'}`)

/** The rules in one line: "Low sensitivity: hands-off 0.90 m³/s, maximum take 5.20 m³/s, 0 % kept, pass flow 0.000 m³/s". */
export function flowRulesLine(d: DepletedReach): string {
  const parts = [
    `hands-off flow ${flow(d.handsOff_m3s)} m³/s`,
    d.maxTake_m3s === null ? 'no maximum take' : `maximum take ${flow(d.maxTake_m3s)} m³/s`,
    `${Math.round(d.keptShare_pct)} % of the flow above the hands-off flow kept in the river`,
    d.passFlow_m3s > 0 ? `fish/eel pass flow ${flow(d.passFlow_m3s)} m³/s` : 'no pass flow',
  ]
  return `${FLOW_RULE_PRESET_LABEL[d.preset]}: ${parts.join(', ')}.`
}

/** Days a year at the hands-off flow only, in words. */
export function handsOffDaysLine(d: DepletedReach): string {
  const base = d.passFlow_m3s > 0 ? 'the hands-off and pass flows' : 'the hands-off flow'
  return d.annualHandsOffOnly_d > 0
    ? `Below the weir the river runs at ${base} only for about ${days(d.annualHandsOffOnly_d)} a year.`
    : `The river below the weir never runs at ${base} only.`
}

/** The landowner's sentence: what stays in the river. */
export function whatStaysSentence(d: DepletedReach): string {
  const median = d.curve.find((c) => c.exceedance === 50)
  const share = median && median.natural_m3s > 0 ? Math.round((median.withScheme_m3s / median.natural_m3s) * 100) : null
  const kept = `At least ${flow(d.handsOff_m3s + d.passFlow_m3s)} m³/s always stays in the river over the weir`
  return share === null
    ? `${kept}; ${handsOffDaysLine(d).charAt(0).toLowerCase()}${handsOffDaysLine(d).slice(1)}`
    : `${kept}; on a typical day about ${share} % of the river's flow still goes over the weir. ${handsOffDaysLine(d)}`
}
