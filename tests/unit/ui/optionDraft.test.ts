// The option form's field catalogue and its draft ⇄ body mapping, checked with the server's schema.
import { describe, expect, it, vi } from 'vitest'
import { DEFAULTS, DIFFUSER_EFFICIENCY } from '../../../shared/engine/defaults'
import { OptionInputSchema } from '../../../shared/schemas/option'
import { useFormState } from '../../../composables/useFormState'
import { blankOptionDraft, bodyFromDraft, draftFromOption, monthsOfText, monthsText, OPTION_FIELDS, OPTION_FORM, OPTION_GROUPS, type OptionDraft, sameDraft, starterDraft } from '../../../utils/optionFields'

/** The draft checked as the new-option form checks it: the body, or null with the messages by field path. */
function checkOptionDraft(draft: OptionDraft) {
  const form = useFormState({ ...OPTION_FORM, blank: draft, schema: OptionInputSchema, send: vi.fn() })
  const input = form.toBody()
  return { input, errors: form.errors.value, formError: form.formError.value }
}

describe('option field catalogue', () => {
  it('gives every field a unit, a known group and (unless required or blank-means) a default with a source', () => {
    const groups = new Set(OPTION_GROUPS.map((g) => g.id))
    const required = new Set(['design.units', 'design.throatDiameter_m', 'design.outletDiameter_m', 'design.throatDepth_m', 'design.air.pipeDiameter_m', 'design.air.pipeLength_m'])
    for (const f of OPTION_FIELDS) {
      expect(f.unit, f.path).not.toBe('')
      expect(groups.has(f.group), f.path).toBe(true)
      if (f.kind === 'select' || required.has(f.path) || f.blankMeans) continue
      const d = f.defaultOf?.(blankOptionDraft())
      expect(d, f.path).toBeTruthy()
      expect(d!.source.length, f.path).toBeGreaterThan(3)
    }
  })

  it('names each path the schema knows: a parsed starter body has a value at every number path', () => {
    const parsed = OptionInputSchema.parse(bodyFromDraft(starterDraft('A')))
    const at = (path: string) => path.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown>)?.[k], parsed)
    for (const f of OPTION_FIELDS) {
      if (['design.diffuserEfficiency', 'design.flowCoefficient', 'design.diffuserLength_m'].includes(f.path)) continue // optional: engine default by type
      expect(at(f.path), f.path).not.toBeUndefined()
    }
  })

  it('shows the diffuser default of the chosen constriction type', () => {
    const d = blankOptionDraft()
    const field = OPTION_FIELDS.find((f) => f.path === 'design.diffuserEfficiency')!
    expect(field.defaultOf!(d)!.value).toBe(DIFFUSER_EFFICIENCY.venturi.value)
    d.values['design.constriction'] = 'sharp-plate'
    expect(field.defaultOf!(d)!.value).toBe(DIFFUSER_EFFICIENCY['sharp-plate'].value)
  })
})

describe('option draft', () => {
  it('a blank draft fails on each required field, keyed by the API path', () => {
    const { input, errors, formError } = checkOptionDraft(blankOptionDraft())
    expect(input).toBeNull()
    expect(formError).toBe(`Check the ${Object.keys(errors).length} marked fields.`)
    expect(errors['name']).toBeTruthy()
    expect(errors['design.units']).toBe('must be a number')
    expect(errors['design.throatDiameter_m']).toBe('must be a number')
    expect(errors['design.air.pipeDiameter_m']).toBe('must be a number')
  })

  it('blank fields take the schema defaults; a blank rating stays null (sized to the design)', () => {
    const { input } = checkOptionDraft(starterDraft('Starter'))
    expect(input).not.toBeNull()
    expect(input!.design.inletLoss).toBe(DEFAULTS.inletLoss.value)
    expect(input!.design.turbine.ratedPower_kW).toBeNull()
    expect(input!.settings.availability).toBe(DEFAULTS.availability.value)
  })

  it('reports a non-integer unit count and an outlet smaller than the throat on their fields', () => {
    const d = starterDraft('Bad')
    d.values['design.units'] = 1.5
    expect(checkOptionDraft(d).errors['design.units']).toBe('must be a whole number')
    // The outlet check runs once the rest of the design is valid (a zod refinement).
    const narrow = starterDraft('Bad')
    narrow.values['design.outletDiameter_m'] = 0.3
    expect(checkOptionDraft(narrow).errors['design.outletDiameter_m']).toBe('must be at least the throat diameter')
  })

  it('round-trips a stored option through the draft without change', () => {
    const stored = OptionInputSchema.parse({ ...bodyFromDraft(starterDraft('Round trip')), notes: 'n' })
    const again = OptionInputSchema.parse(bodyFromDraft(draftFromOption(stored)))
    expect(again).toEqual(stored)
    expect(sameDraft(draftFromOption(stored), draftFromOption(again))).toBe(true)
    const changed = draftFromOption(stored)
    changed.values['design.units'] = 5
    expect(sameDraft(changed, draftFromOption(stored))).toBe(false)
  })
})

describe('closed months in the draft', () => {
  const CLOSED = 'design.operation.closedMonths'

  it('holds a set of months as sorted text without repeats, and reads it back', () => {
    expect(monthsText([9, 6, 7, 6])).toBe('6,7,9')
    expect(monthsText([])).toBe('')
    expect(monthsOfText('6,7,9')).toEqual([6, 7, 9])
    expect(monthsOfText(' 6 , 7,,')).toEqual([6, 7])
    expect(monthsOfText('')).toEqual([])
    // Not a month is kept for the schema to refuse, never dropped.
    expect(monthsOfText('6,x')).toEqual([6, Number.NaN])
  })

  it('starts with no closed month and sends an empty list', () => {
    const d = starterDraft('Open all year')
    expect(d.values[CLOSED]).toBe('')
    expect(checkOptionDraft(d).input!.design.operation.closedMonths).toEqual([])
  })

  it('sends the ticked months as numbers, stores them, and shows a stored option\'s months as the draft text', () => {
    const d = starterDraft('Closed in summer')
    d.values[CLOSED] = monthsText([8, 7])
    const { input } = checkOptionDraft(d)
    expect(input!.design.operation.closedMonths).toEqual([7, 8])
    const back = draftFromOption(input!)
    expect(back.values[CLOSED]).toBe('7,8')
    const other = draftFromOption(input!)
    expect(sameDraft(back, other)).toBe(true)
    other.values[CLOSED] = '7'
    expect(sameDraft(back, other)).toBe(false)
  })

  it('refuses a month that is not 1–12, naming the field', () => {
    const d = starterDraft('Bad month')
    d.values[CLOSED] = '6,13'
    expect(checkOptionDraft(d).errors[`${CLOSED}.1`]).toBe('must be a month 1–12')
  })

  it('gives the operating mode and the closed months a caution, in the operation group', () => {
    const byPath = (p: string) => OPTION_FIELDS.find((f) => f.path === p)!
    expect(byPath('design.operation.mode').caution).toMatch(/River first may cost energy/)
    expect(byPath(CLOSED).caution).toMatch(/consent[\s\S]*regulator/)
    expect(byPath(CLOSED).kind).toBe('months')
    expect(OPTION_GROUPS.map((g) => g.id)).toContain('operation')
    expect(OPTION_FIELDS.filter((f) => f.group === 'operation').map((f) => f.path)).toEqual(['design.operation.mode', 'design.operation.allowedDrawdown_m', CLOSED])
  })
})
