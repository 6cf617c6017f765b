// Pure helpers of the review comment thread (utils/comments.ts): the body the form sends,
// the tags of what a comment points at, and the @mention parts set apart when shown, checked against
// the server's own mention finder (server/domain/review.ts) so the two agree on what is a mention.
import { describe, expect, it } from 'vitest'
import { CommentInputSchema } from '../../../shared/schemas/review'
import { findMentions } from '../../../server/domain/review'
import { commentBody, commentTags, mentionBeingTyped, splitMentions } from '../../../utils/comments'

describe('the comment body', () => {
  it('leaves blank selects out, so the schema sees only what was chosen', () => {
    expect(commentBody({ body: 'Check August', assessmentId: '', month: 8, flagId: '' })).toEqual({ body: 'Check August', month: 8 })
    expect(commentBody({ body: 'x', assessmentId: 12, month: '', flagId: 'gas-supersaturation' })).toEqual({ body: 'x', assessmentId: 12, flagId: 'gas-supersaturation' })
  })
  it('gives a body the shared schema accepts as it is', () => {
    const body = commentBody({ body: 'Gas at high flow?', assessmentId: 3, month: 12, flagId: 'gas-supersaturation' })
    expect(CommentInputSchema.parse(body)).toEqual(body)
  })
  it('is refused by the schema when empty, naming the body', () => {
    expect(CommentInputSchema.safeParse(commentBody({ body: '   ', assessmentId: '', month: '', flagId: '' })).error!.issues[0]!.path).toEqual(['body'])
  })
})

describe('comment tags', () => {
  it('names the assessment, the month and the flag a comment points at', () => {
    expect(commentTags({ assessmentId: 4, month: 8, flagId: 'net-oxygen-loss' })).toEqual(['Assessment 4', 'August', 'Oxygen cost to the river'])
    expect(commentTags({ assessmentId: null, month: null, flagId: null })).toEqual([])
  })
})

describe('mentions', () => {
  const people = [
    { id: 1, name: 'Elspeth Garrow', email: 'elspeth@fellside-agency.example' },
    { id: 2, name: 'Idris Penrose', email: 'idris@tarnbeck.example' },
  ]

  it('sees a mention being typed at the end of the text only', () => {
    expect(mentionBeingTyped('Please check @Elsp')).toBe('Elsp')
    expect(mentionBeingTyped('Please check @')).toBe('')
    expect(mentionBeingTyped('Please check @Elspeth Garrow now')).toBeNull()
    expect(mentionBeingTyped('mail me at a@b')).toBeNull()
  })

  it('sets apart the full names the server found and any @e-mail', () => {
    const body = 'Thanks @elspeth garrow, and @idris@tarnbeck.example: see August.'
    const names = findMentions(body, people).map((p) => p.name)
    expect(names).toEqual(['Elspeth Garrow', 'Idris Penrose'])
    const parts = splitMentions(body, names)
    expect(parts.filter((p) => p.mention).map((p) => p.text)).toEqual(['@elspeth garrow', '@idris@tarnbeck.example'])
    expect(parts.map((p) => p.text).join('')).toBe(body)
  })

  it('leaves alone an @word that names nobody, and a name that runs on into more letters', () => {
    const body = 'Ask @someone or @Elspeth Garrowby.'
    expect(findMentions(body, people)).toEqual([])
    expect(splitMentions(body, ['Elspeth Garrow']).some((p) => p.mention)).toBe(false)
  })
})
