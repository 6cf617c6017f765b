import { describe, expect, it } from 'vitest'
import { REVIEW_DECISIONS, REVIEW_STATES, type ReviewState } from '../../../shared/schemas/review'
import { reviewActionsIn, reviewTransition, type ReviewAction } from '../../../server/domain/review'

// The review workflow of the issue: draft → submitted → accepted / accepted-with-conditions /
// returned, and submitted again after returned. Everything else is refused with the current state named.

const SUBMIT: ReviewAction = { kind: 'submit' }
const decide = (decision: (typeof REVIEW_DECISIONS)[number]): ReviewAction => ({ kind: 'decide', decision })

describe('reviewTransition', () => {
  it('allows exactly the steps of the workflow', () => {
    const allowed: string[] = []
    for (const state of REVIEW_STATES) {
      for (const action of [SUBMIT, ...REVIEW_DECISIONS.map(decide)]) {
        const t = reviewTransition(state, action)
        if (t.ok) allowed.push(`${state} -${action.kind === 'submit' ? 'submit' : action.decision}-> ${t.to}`)
      }
    }
    expect(allowed.sort()).toEqual(
      [
        'draft -submit-> submitted',
        'returned -submit-> submitted',
        'submitted -accepted-> accepted',
        'submitted -accepted-with-conditions-> accepted-with-conditions',
        'submitted -returned-> returned',
      ].sort(),
    )
  })

  it('names the current state in every refusal, and the field first', () => {
    for (const state of REVIEW_STATES) {
      for (const action of [SUBMIT, decide('accepted')]) {
        const t = reviewTransition(state, action)
        if (t.ok) continue
        expect(t.from).toBe(state)
        expect(t.message.startsWith('review: ')).toBe(true)
        expect(t.message).toContain(` ${state} (`)
      }
    }
  })

  it('says why: already waiting, must be submitted first, or already decided', () => {
    const msg = (s: ReviewState, a: ReviewAction) => {
      const t = reviewTransition(s, a)
      return t.ok ? '' : t.message
    }
    expect(msg('submitted', SUBMIT)).toMatch(/already waiting/)
    expect(msg('draft', decide('accepted'))).toMatch(/submitted first/)
    expect(msg('returned', decide('returned'))).toMatch(/submitted first/)
    expect(msg('accepted', decide('returned'))).toMatch(/already been decided/)
    expect(msg('accepted-with-conditions', SUBMIT)).toMatch(/final/)
  })
})

describe('reviewActionsIn', () => {
  it('offers submit in draft and returned, decide in submitted, nothing once accepted', () => {
    expect(REVIEW_STATES.map((s) => [s, reviewActionsIn(s)])).toEqual([
      ['draft', { submit: true, decide: false }],
      ['submitted', { submit: false, decide: true }],
      ['accepted', { submit: false, decide: false }],
      ['accepted-with-conditions', { submit: false, decide: false }],
      ['returned', { submit: true, decide: false }],
    ])
  })
})
