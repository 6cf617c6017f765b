// The option form's field catalogue (label, unit, default and where the default comes from) and the
// draft the form holds, with the draft ⇄ body mapping that useFormState checks by the server's own
// schema (OPTION_FORM). Shapes come from shared/schemas/option.ts, written once; defaults from
// shared/engine/defaults.ts.
import { DEFAULTS, DIFFUSER_EFFICIENCY, FLOW_COEFFICIENT, MAX_MONTE_CARLO_DRAWS, type ConstrictionType, type SourcedValue } from '#shared/engine/defaults'
import { MONEY_DEFAULTS } from '#shared/engine/money'
import { BASELINE_DEFAULTS, BASELINE_KIND_LABEL, BASELINE_KINDS, BASELINE_PRICE_PER_KW, type BaselineKind } from '#shared/engine/baselineUnits'
import type { OptionDto } from '#shared/schemas/option'
import type { CheckIssue, FormMessages } from './formState'

// ——— the field catalogue ———

/** The groups of the option form, in the order shown. */
export const OPTION_GROUPS = [
  { id: 'geometry', title: 'Units and throat', note: 'How many venturi units, their size and how deep the throat sits.' },
  { id: 'losses', title: 'Constriction and losses', note: 'The kind of constriction and the losses on the water path.' },
  { id: 'air', title: 'Air pipe and air pump', note: 'The pipe that carries air down to each throat, and how well the throat pumps it.' },
  { id: 'turbine', title: 'Turbine and generator', note: 'The air turbine on the bank and its generator, per unit.' },
  { id: 'operation', title: 'How the units are run', note: 'The head pool is always held near its level: a unit opens only when the river can feed it there, and only while it draws air and makes power. Choose whether the river comes first, and any months the units must stay shut (a consent may require it).' },
  { id: 'money', title: 'Costs and money', note: 'Amounts are in the organisation\'s currency. The equipment and civil-works defaults are worked from published UK low-head costs (their source shows on hover); the rest are illustrative. Replace them with the project\'s own figures.' },
  { id: 'baseline', title: 'Conventional turbine for comparison', note: 'A conventional low-head unit at the same weir, under the same flow rules, set beside this option in the results: what the river gains for the energy the venturi scheme gives up.' },
  { id: 'settings', title: 'Engine settings', note: 'Safety limits, oxygen transfer and availability used by this option\'s assessments. The downstream oxygen target is the site\'s own.' },
] as const

export type OptionGroupId = (typeof OPTION_GROUPS)[number]['id']

/** A choice of a select field. */
export interface FieldChoice {
  value: string
  label: string
}

/** One field of the option form. `path` is the body path, as the schema reports errors (`design.air.pipeDiameter_m`). */
export interface OptionField {
  path: string
  label: string
  /** Unit shown beside the value; '–' for a pure number. */
  unit: string
  group: OptionGroupId
  /** `months`: a set of calendar months, held in the draft as text such as "6,7,8,9". */
  kind: 'number' | 'select' | 'months'
  /** Whole numbers only. */
  integer?: boolean
  /** The default in force for this draft (some depend on the constriction type); null when the field has none. */
  defaultOf?: (draft: OptionDraft) => SourcedValue | null
  /** What a blank field means when it is not simply "the default" (e.g. rating sized to the design). */
  blankMeans?: string
  choices?: readonly FieldChoice[]
  /** A short line under the field. */
  hint?: string
  /** A caution beside the field, in plain words, where the choice has a cost or needs someone else's word. */
  caution?: string
  /** Shown under "more settings" (closed at first). */
  advanced?: boolean
}

const CONSTRICTIONS: readonly FieldChoice[] = [
  { value: 'venturi', label: 'Venturi with long diffuser' },
  { value: 'short-nozzle', label: 'Short nozzle' },
  { value: 'sharp-plate', label: 'Sharp-edged plate' },
]

const fixed = (d: SourcedValue) => () => d

const byConstriction = (table: Readonly<Record<ConstrictionType, SourcedValue>>) => (draft: OptionDraft) =>
  table[(draft.values['design.constriction'] as ConstrictionType | undefined) ?? 'venturi'] ?? table.venturi

const byBaselineKind = (draft: OptionDraft) => BASELINE_PRICE_PER_KW[(draft.values['design.baseline.kind'] as BaselineKind | undefined) ?? 'screw'] ?? BASELINE_PRICE_PER_KW.screw

const PERCENT_NOTE = 'a fraction: 0.95 means 95 %'

/** Every field of the option form, in order within its group. */
export const OPTION_FIELDS: readonly OptionField[] = [
  { path: 'design.units', label: 'Number of units', unit: 'units', group: 'geometry', kind: 'number', integer: true },
  { path: 'design.throatDiameter_m', label: 'Throat diameter', unit: 'm', group: 'geometry', kind: 'number' },
  { path: 'design.outletDiameter_m', label: 'Outlet diameter', unit: 'm', group: 'geometry', kind: 'number', hint: 'at least the throat diameter' },
  { path: 'design.throatDepth_m', label: 'Throat submergence', unit: 'm', group: 'geometry', kind: 'number', hint: 'depth of the throat centreline below the tail-pool surface; where the site takes its heads from the weir hydraulics, its depth at the median river flow (it moves with the tail at other flows)' },
  { path: 'design.constriction', label: 'Constriction type', unit: '–', group: 'losses', kind: 'select', choices: CONSTRICTIONS },
  { path: 'design.inletLoss', label: 'Inlet loss coefficient k_in', unit: '–', group: 'losses', kind: 'number', defaultOf: fixed(DEFAULTS.inletLoss), hint: 'on the throat velocity head' },
  { path: 'design.diffuserEfficiency', label: 'Diffuser efficiency η_d', unit: 'fraction', group: 'losses', kind: 'number', defaultOf: byConstriction(DIFFUSER_EFFICIENCY), hint: 'share of the ideal pressure recovery' },
  { path: 'design.flowCoefficient', label: 'Flow coefficient C', unit: '–', group: 'losses', kind: 'number', defaultOf: byConstriction(FLOW_COEFFICIENT) },
  { path: 'design.diffuserLength_m', label: 'Diffuser length', unit: 'm', group: 'losses', kind: 'number', blankMeans: 'a cone of the diffuser half-angle set below' },
  { path: 'settings.diffuserHalfAngle_deg', label: 'Diffuser half-angle', unit: '°', group: 'losses', kind: 'number', defaultOf: fixed(DEFAULTS.diffuserHalfAngle), hint: 'used when no diffuser length is given' },
  { path: 'design.air.pipeDiameter_m', label: 'Air pipe diameter', unit: 'm', group: 'air', kind: 'number' },
  { path: 'design.air.pipeLength_m', label: 'Air pipe length', unit: 'm', group: 'air', kind: 'number' },
  { path: 'design.air.pipeLossK', label: 'Air pipe fittings loss K', unit: '–', group: 'air', kind: 'number', defaultOf: fixed(DEFAULTS.airPipeLossK) },
  { path: 'design.air.frictionFactor', label: 'Air pipe friction factor f', unit: '–', group: 'air', kind: 'number', defaultOf: fixed(DEFAULTS.airPipeFrictionFactor) },
  { path: 'design.air.jetPumpEfficiency', label: 'Peak water-jet pump efficiency η_ej', unit: 'fraction', group: 'air', kind: 'number', defaultOf: fixed(DEFAULTS.jetPumpEfficiency) },
  { path: 'design.air.maxGasLiquidRatio', label: 'Most air per water volume β_max', unit: 'm³/m³', group: 'air', kind: 'number', defaultOf: fixed(DEFAULTS.maxGasLiquidRatio) },
  { path: 'design.turbine.efficiency', label: 'Air turbine efficiency', unit: 'fraction', group: 'turbine', kind: 'number', defaultOf: fixed(DEFAULTS.turbineEfficiency) },
  { path: 'design.turbine.generatorEfficiency', label: 'Generator efficiency', unit: 'fraction', group: 'turbine', kind: 'number', defaultOf: fixed(DEFAULTS.generatorEfficiency) },
  { path: 'design.turbine.ratedPower_kW', label: 'Rated electrical power per unit', unit: 'kW', group: 'turbine', kind: 'number', blankMeans: 'sized to the design point' },
  { path: 'design.turbine.cutInFraction', label: 'Turbine cut-in', unit: 'fraction', group: 'turbine', kind: 'number', defaultOf: fixed(DEFAULTS.turbineCutInFraction), hint: 'of the rating' },
  {
    path: 'design.turbine.soundPower_dBA', label: 'Air turbine sound power level', unit: 'dB(A)', group: 'turbine', kind: 'number', blankMeans: 'no noise check',
    hint: 'enter the maker\'s figure (A-weighted sound power of one turbine, 40–140 dB(A)); the site\'s consents list works out the level at the nearest dwelling',
  },
  {
    path: 'design.operation.mode', label: 'Operating mode', unit: '–', group: 'operation', kind: 'select',
    choices: [{ value: 'energy-first', label: 'Energy first: every unit that can run does' }, { value: 'river-first', label: 'River first: never at the river\'s oxygen cost' }],
    hint: 'river first shuts a unit wherever running it would cost the river more oxygen than the acceptable loss, or lower it while the river is below its target',
    caution: 'River first may cost energy: a unit kept shut for the river makes nothing meanwhile. The results show both modes side by side, with the energy given up.',
  },
  { path: 'design.operation.allowedDrawdown_m', label: 'Allowed head-pool drawdown', unit: 'm', group: 'operation', kind: 'number', defaultOf: fixed(DEFAULTS.allowedDrawdown), hint: 'how far below its ordinary level the head pool may fall while units run' },
  { path: 'design.operation.closedMonths', label: 'Closed months', unit: '–', group: 'operation', kind: 'months', blankMeans: 'no closed month', hint: 'every unit stays shut in these months',
    caution: 'Closed months are usually a condition of a consent (fish migration, low summer oxygen): take them from the regulator, not from this screening.',
  },
  { path: 'design.costs.fixedCost', label: 'Fixed cost', unit: 'currency', group: 'money', kind: 'number', defaultOf: fixed(MONEY_DEFAULTS.fixedCost), hint: 'connection, design, consents' },
  { path: 'design.costs.ratedPowerPrice', label: 'Equipment per kW of rating', unit: 'currency/kW', group: 'money', kind: 'number', defaultOf: fixed(MONEY_DEFAULTS.ratedPowerPrice), hint: 'air turbine, generator, controls' },
  { path: 'design.costs.civilsPerDesignFlow', label: 'Civil works per m³/s of design flow', unit: 'currency/(m3/s)', group: 'money', kind: 'number', defaultOf: fixed(MONEY_DEFAULTS.civilsPerDesignFlow), hint: 'design flow: every unit full at the gross head' },
  { path: 'settings.discountRate', label: 'Discount rate', unit: 'fraction/yr', group: 'money', kind: 'number', defaultOf: fixed(MONEY_DEFAULTS.discountRate), hint: '0.08 means 8 % a year' },
  { path: 'settings.life_yr', label: 'Economic life', unit: 'yr', group: 'money', kind: 'number', defaultOf: fixed(MONEY_DEFAULTS.life_yr) },
  { path: 'settings.opexFraction', label: 'Operating cost', unit: 'fraction/yr', group: 'money', kind: 'number', defaultOf: fixed(MONEY_DEFAULTS.opexFraction), hint: 'of the capital cost' },
  { path: 'settings.exportPrice', label: 'Export price', unit: 'currency/MWh', group: 'money', kind: 'number', defaultOf: fixed(MONEY_DEFAULTS.exportPrice) },
  { path: 'settings.gridFactor', label: 'Grid emission factor', unit: 't CO₂/MWh', group: 'money', kind: 'number', defaultOf: fixed(MONEY_DEFAULTS.gridFactor) },
  {
    path: 'design.baseline.kind', label: 'Kind of turbine', unit: '–', group: 'baseline', kind: 'select',
    choices: BASELINE_KINDS.map((k) => ({ value: k, label: BASELINE_KIND_LABEL[k].replace(/^./, (c) => c.toUpperCase()) })),
    hint: 'each kind has its own part-load efficiency curve, shown with its source in the results',
  },
  { path: 'design.baseline.designFlow_m3s', label: 'Design flow', unit: 'm³/s', group: 'baseline', kind: 'number', blankMeans: 'what the flow rules allow at the flow exceeded 30 % of the time (common practice)' },
  { path: 'design.baseline.headLossFraction', label: 'Head lost before the runner', unit: 'fraction', group: 'baseline', kind: 'number', defaultOf: fixed(BASELINE_DEFAULTS.headLossFraction), hint: 'screen, channel and draft tube: 0.05 means 5 % of the gross head' },
  { path: 'design.baseline.generatorEfficiency', label: 'Generator efficiency', unit: 'fraction', group: 'baseline', kind: 'number', defaultOf: fixed(BASELINE_DEFAULTS.generatorEfficiency) },
  { path: 'design.baseline.costs.ratedPowerPrice', label: 'Installed cost per kW', unit: 'currency/kW', group: 'baseline', kind: 'number', defaultOf: byBaselineKind, hint: 'civil works, consents and plant together' },
  { path: 'design.baseline.costs.fixedCost', label: 'Fixed cost', unit: 'currency', group: 'baseline', kind: 'number', defaultOf: fixed(BASELINE_DEFAULTS.fixedCost) },
  { path: 'settings.availability', label: 'Availability', unit: 'fraction', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.availability), hint: PERCENT_NOTE },
  { path: 'settings.minCavitationMargin_m', label: 'Least cavitation margin', unit: 'm', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.minCavitationMargin) },
  { path: 'settings.acceptableOxygenLoss_mgL', label: 'Acceptable net oxygen loss', unit: 'mg/L', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.acceptableOxygenLoss), hint: 'a loss beyond this is a river caution; the regulator\'s figure replaces it' },
  { path: 'settings.tdgExcessLimit_mmHg', label: 'Dissolved gas excess pressure limit ΔP', unit: 'mmHg', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.tdgExcessLimit), hint: 'the stricter of this and the % limit applies' },
  { path: 'settings.tdgLimit', label: 'Total dissolved gas limit', unit: 'fraction', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.tdgLimit), hint: 'of saturation: 1.10 means 110 %' },
  {
    path: 'settings.oxygenMethod', label: 'Oxygen method for the summary', unit: '–', group: 'settings', kind: 'select',
    choices: [{ value: 'bubble-model', label: 'Bubble model (bubbles followed from throat to surface)' }, { value: 'field-transfer', label: 'Field transfer per metre of submergence (cross-check)' }],
  },
  { path: 'settings.sotePerMetre', label: 'Oxygen transfer per metre of submergence', unit: 'fraction/m', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.sotePerMetre), hint: 'field-transfer cross-check; 0.04 means 4 % of the oxygen supplied per metre' },
  { path: 'settings.inDeviceTransfer', label: 'Oxygen transfer in the device', unit: 'fraction', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.inDeviceTransfer), hint: 'field-transfer cross-check: the share transferred whatever the depth', advanced: true },
  { path: 'settings.alpha', label: 'Transfer factor α', unit: '–', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.alpha), advanced: true },
  { path: 'settings.beta', label: 'Saturation factor β', unit: '–', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.beta), advanced: true },
  { path: 'settings.theta', label: 'Temperature factor θ', unit: '–', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.theta), advanced: true },
  { path: 'settings.bubbleDiameter_m', label: 'Bubble diameter at the throat', unit: 'm', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.bubbleDiameter), hint: '0.001–0.006 m; smaller bubbles carry more oxygen and more dissolved gas into the river' },
  {
    path: 'settings.filmModel', label: 'Bubble surface', unit: '–', group: 'settings', kind: 'select', advanced: true,
    choices: [{ value: 'mcginnis-little', label: 'River water (McGinnis & Little 2002)' }, { value: 'higbie', label: 'Clean surface (Higbie), more transfer' }, { value: 'frossling', label: 'Rigid surface (Frössling), less transfer' }],
  },
  { path: 'settings.plumeVelocity_ms', label: 'Plume velocity in the tail pool', unit: 'm/s', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.plumeVelocity), advanced: true },
  { path: 'settings.oxygenDiffusivity20', label: 'O₂ diffusivity at 20 °C', unit: 'm²/s', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.oxygenDiffusivity20), advanced: true },
  { path: 'settings.upstreamNitrogenSaturation', label: 'Upstream nitrogen saturation', unit: 'fraction', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.upstreamNitrogenSaturation), advanced: true },
  { path: 'settings.airTemperatureOffset_K', label: 'Intake air above water temperature', unit: 'K', group: 'settings', kind: 'number', defaultOf: fixed(DEFAULTS.airTemperatureOffset), advanced: true },
  { path: 'settings.monteCarloDraws', label: 'Monte Carlo draws', unit: 'draws', group: 'settings', kind: 'number', integer: true, defaultOf: fixed(DEFAULTS.monteCarloDraws), hint: `how many times a stored assessment re-runs the year with the uncertain inputs drawn afresh; 0 for none, at most ${MAX_MONTE_CARLO_DRAWS}`, advanced: true },
  { path: 'settings.monteCarloSeed', label: 'Monte Carlo seed', unit: '–', group: 'settings', kind: 'number', integer: true, defaultOf: fixed(DEFAULTS.monteCarloSeed), hint: 'the same seed gives the same draws, so a stored assessment re-runs to the same figures', advanced: true },
]

/** Select fields with the value a blank draft starts at (the schema's default). */
const SELECT_DEFAULTS: Record<string, string> = {
  'design.operation.mode': 'energy-first',
  'design.constriction': 'venturi',
  'settings.oxygenMethod': 'bubble-model',
  'settings.filmModel': 'mcginnis-little',
  'design.baseline.kind': 'screw',
}

// ——— the draft ———

/** A field's value in the form: a number, null when blank, NaN when the text is not a number; selects hold text. */
export type DraftValue = number | string | null

/** What the option form holds. */
export interface OptionDraft {
  name: string
  notes: string
  values: Record<string, DraftValue>
}

function getPath(obj: unknown, path: string): unknown {
  return path.split('.').slice(1).reduce<unknown>((o, k) => (o && typeof o === 'object' ? (o as Record<string, unknown>)[k] : undefined), obj)
}

function setPath(obj: Record<string, unknown>, keys: string[], value: unknown) {
  let o = obj
  keys.slice(0, -1).forEach((k) => {
    o[k] ??= {}
    o = o[k] as Record<string, unknown>
  })
  o[keys[keys.length - 1]!] = value
}

/** An empty draft: every field blank (defaults apply), selects at their schema default. */
export function blankOptionDraft(name = ''): OptionDraft {
  const values: Record<string, DraftValue> = {}
  for (const f of OPTION_FIELDS) values[f.path] = f.kind === 'select' ? (SELECT_DEFAULTS[f.path] ?? null) : f.kind === 'months' ? '' : null
  return { name, notes: '', values }
}

/** A draft holding a stored option's values. */
export function draftFromOption(o: Pick<OptionDto, 'name' | 'notes' | 'design' | 'settings'>): OptionDraft {
  const draft = blankOptionDraft(o.name)
  draft.notes = o.notes
  const source = { design: o.design, settings: o.settings }
  for (const f of OPTION_FIELDS) {
    const v = getPath(source[f.path.split('.')[0] as 'design' | 'settings'], f.path)
    if (typeof v === 'number' || typeof v === 'string') draft.values[f.path] = v
    else if (f.kind === 'months' && Array.isArray(v)) draft.values[f.path] = monthsText(v as number[])
  }
  return draft
}

/**
 * The body the draft stands for (before the schema check): blank fields are left out so the
 * schema's defaults fill them, except a blank rating, which is sent as null (sized to the design).
 */
export function bodyFromDraft(draft: OptionDraft): Record<string, unknown> {
  const body: Record<string, unknown> = { name: draft.name, notes: draft.notes, design: { air: {} }, settings: {} }
  for (const f of OPTION_FIELDS) {
    const v = draft.values[f.path]
    if (f.kind === 'months') {
      setPath(body, f.path.split('.'), monthsOfText(typeof v === 'string' ? v : ''))
      continue
    }
    if (v === null || v === undefined || v === '') {
      if (f.path === 'design.turbine.ratedPower_kW') setPath(body, f.path.split('.'), null)
      continue
    }
    setPath(body, f.path.split('.'), v)
  }
  return body
}

/** A set of months as the draft holds it: sorted month numbers joined by commas ("6,7,8,9"), '' for none. */
export function monthsText(months: readonly number[]): string {
  return [...new Set(months)].sort((a, b) => a - b).join(',')
}

/** The month numbers of a draft's text (anything that is not a whole number is kept for the schema to refuse). */
export function monthsOfText(text: string): number[] {
  return text.split(',').map((t) => t.trim()).filter((t) => t !== '').map(Number)
}

/** The option form's wording: a message per field path (`form` for the body itself), and a count of marked fields. */
const OPTION_FORM_MESSAGES: FormMessages = {
  issues: (issues: readonly CheckIssue[]) => {
    const errors: Record<string, string> = {}
    for (const issue of issues) errors[issue.path.map(String).join('.') || 'form'] ??= issue.message
    return errors
  },
  refused: (errors) => {
    const count = Object.keys(errors).length
    return `Check the ${count === 1 ? 'marked field' : `${count} marked fields`}.`
  },
  failed: (fields, message) => (Object.keys(fields).length ? `Check the marked fields: ${message}` : message),
}

/** True when two drafts hold the same values. */
export function sameDraft(a: OptionDraft, b: OptionDraft): boolean {
  if (a.name !== b.name || a.notes !== b.notes) return false
  return OPTION_FIELDS.every((f) => Object.is(a.values[f.path] ?? null, b.values[f.path] ?? null))
}

/** A starting design for a new option, for a weir of 1–3 m: two units of a 0.5 m throat set 2.5 m deep. */
export function starterDraft(name: string): OptionDraft {
  const d = blankOptionDraft(name)
  Object.assign(d.values, {
    'design.units': 2, 'design.throatDiameter_m': 0.5, 'design.outletDiameter_m': 1.0, 'design.throatDepth_m': 2.5,
    'design.air.pipeDiameter_m': 0.4, 'design.air.pipeLength_m': 8,
  })
  return d
}

/** What both option forms (new and stored) give useFormState besides their schema and request. */
export const OPTION_FORM = {
  draftOf: (option: OptionDto) => draftFromOption(option),
  same: sameDraft,
  toBody: bodyFromDraft,
  messages: OPTION_FORM_MESSAGES,
}
