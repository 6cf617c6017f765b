import { describe, expect, it } from 'vitest'
import { commentPointsAt, findMentions } from '../../../server/domain/review'

const people = [
  { id: 1, name: 'Idris Penrose', email: 'idris@tarnbeck.example' },
  { id: 2, name: 'Elspeth Garrow', email: 'elspeth@fellside-agency.example' },
  { id: 3, name: 'Idris', email: 'idris.pen@other.example' },
]
const ids = (body: string) => findMentions(body, people).map((p) => p.id)

describe('findMentions', () => {
  it('finds a member by e-mail or by full name, any case, each once, in order of first mention', () => {
    expect(ids('@elspeth@fellside-agency.example please look, and @IDRIS PENROSE too')).toEqual([2, 1])
    expect(ids('@Elspeth Garrow, @elspeth@fellside-agency.example again')).toEqual([2])
  })

  it('does not run on into a longer name, address or word', () => {
    expect(ids('@idris@tarnbeck.example.uk')).toEqual([])
    expect(ids('@Elspeth Garrowe')).toEqual([])
    // …but a shorter member's name that ends at a space is theirs.
    expect(ids('@Idris Penrosee')).toEqual([3])
    expect(ids('mail me at x@Idris Penrose')).toEqual([])
    // "Idris" alone names only the member whose full name is "Idris".
    expect(ids('@Idris, can you check?')).toEqual([3])
  })

  it('allows punctuation after a mention and ignores text with no @', () => {
    expect(ids('Thanks (@Idris Penrose).')).toEqual([1])
    expect(ids('Idris Penrose and Elspeth Garrow')).toEqual([])
  })

  it('treats regular-expression characters in names literally', () => {
    expect(findMentions('@A+B (Ltd) said so', [{ id: 9, name: 'A+B (Ltd)', email: 'ab@x.example' }]).map((p) => p.id)).toEqual([9])
    expect(findMentions('@AAB (Ltd) said so', [{ id: 9, name: 'A+B (Ltd)', email: 'ab@x.example' }])).toEqual([])
  })
})

describe('commentPointsAt', () => {
  it('names what a comment is about in plain words', () => {
    expect(commentPointsAt({ assessmentId: 4, month: 8, flagId: 'gas-supersaturation' })).toBe('assessment 4, August, the gas-supersaturation flag')
    expect(commentPointsAt({})).toBeNull()
  })
})
