// The consents section's drafts: one permission's edit row and the site's constraints, as the inputs
// hold them (text), with the bodies they stand for (checked by the server's own schemas), the status
// badges' tones and the list as a CSV.
import type { ConsentDto, ConsentListDto, ConstraintsDto } from '#shared/schemas/consent'
import type { ConsentStatus } from '#shared/utils/consents'
import type { CsvCell } from './csv'

/** What a permission's edit row holds. */
export interface ConsentDraft {
  status: ConsentStatus
  reference: string
  appliedOn: string
  decidedOn: string
  conditions: string
  notes: string
}

/** A stored permission as its edit row holds it. */
export function consentDraftOf(c: ConsentDto): ConsentDraft {
  return { status: c.status, reference: c.reference, appliedOn: c.appliedOn ?? '', decidedOn: c.decidedOn ?? '', conditions: c.conditions, notes: c.notes }
}

/** The body an edit row stands for: blank dates are none. */
export function consentBody(d: ConsentDraft) {
  return { status: d.status, reference: d.reference, appliedOn: d.appliedOn || null, decidedOn: d.decidedOn || null, conditions: d.conditions, notes: d.notes }
}

/** What the constraints form holds. */
export interface ConstraintsDraft {
  nearestDwelling_m: string
  noiseLimit_dBA: string
  isGaugingStation: boolean
}

/** Stored constraints as the form holds them. */
export function constraintsDraftOf(c: ConstraintsDto): ConstraintsDraft {
  return { nearestDwelling_m: c.nearestDwelling_m === null ? '' : String(c.nearestDwelling_m), noiseLimit_dBA: c.noiseLimit_dBA === null ? '' : String(c.noiseLimit_dBA), isGaugingStation: c.isGaugingStation }
}

const numberOrNull = (text: string) => (text.trim() === '' ? null : Number(text))

/** The body the constraints form stands for: a blank distance is none, a blank limit takes the default. */
export function constraintsBody(d: ConstraintsDraft) {
  return { nearestDwelling_m: numberOrNull(d.nearestDwelling_m), noiseLimit_dBA: numberOrNull(d.noiseLimit_dBA), isGaugingStation: d.isGaugingStation }
}

/** The tone of each status badge; the badge always shows the words too. */
export const CONSENT_STATUS_TONES: Record<ConsentStatus, string> = {
  'not-started': 'bg-peat-100 text-peat-700 ring-peat-300',
  'not-needed': 'bg-white text-peat-600 ring-peat-200',
  applied: 'bg-gill-50 text-gill-800 ring-gill-300',
  granted: 'bg-lichen-100 text-lichen-600 ring-lichen-400',
  'granted-with-conditions': 'bg-lichen-100 text-peat-800 ring-lichen-500',
  refused: 'bg-ember-50 text-ember-700 ring-ember-300',
}

/** The CSV columns of the list. */
export const CONSENT_CSV_COLUMNS = ['kind', 'permission', 'status', 'reference', 'applied_on', 'decided_on', 'conditions', 'notes'] as const

/** The list's rows for the CSV, in CONSENT_CSV_COLUMNS order. */
export function consentCsvRows(list: Pick<ConsentListDto, 'consents'>): CsvCell[][] {
  return list.consents.map((c) => [c.kind, c.label, c.statusLabel, c.reference, c.appliedOn, c.decidedOn, c.conditions, c.notes])
}
