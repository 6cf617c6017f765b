// Pure helpers of administration (utils/audit.ts, utils/invitations.ts): the
// audit filter query, the before/after rows of an entry, and the words for a closed invitation.
import { describe, expect, it } from 'vitest'
import { AuditQuerySchema } from '../../../shared/schemas/admin'
import { InvitationInputSchema } from '../../../shared/schemas/invitation'
import { auditDetailRows, auditQuery, EMPTY_AUDIT_FILTERS } from '../../../utils/audit'
import { afterAcceptPath, closedInvitation } from '../../../utils/invitations'

describe('audit filter query', () => {
  it('leaves blank filters out and trims text', () => {
    expect(auditQuery({ ...EMPTY_AUDIT_FILTERS }, 1)).toEqual({ page: 1, pageSize: 25 })
    expect(auditQuery({ action: ' review. ', userId: 3, targetType: 'site', from: '2026-03-01', to: '2026-03-31' }, 2)).toEqual({
      page: 2, pageSize: 25, action: 'review.', userId: 3, targetType: 'site', from: '2026-03-01', to: '2026-03-31',
    })
  })
  it('makes queries the server schema accepts, and one it refuses names the field', () => {
    expect(AuditQuerySchema.safeParse(auditQuery({ ...EMPTY_AUDIT_FILTERS, action: 'member.role-changed', targetType: 'summary_link' }, 1)).success).toBe(true)
    const backwards = AuditQuerySchema.safeParse(auditQuery({ ...EMPTY_AUDIT_FILTERS, from: '2026-03-10', to: '2026-03-01' }, 1))
    expect(backwards.error!.issues[0]!.path).toEqual(['to'])
  })
})

describe('audit entry details', () => {
  it('gives one row per field of before and after', () => {
    expect(auditDetailRows({ before: { state: 'pending' }, after: { state: 'accepted' }, email: 'a@b.example' })).toEqual([
      { key: 'state', before: 'pending', after: 'accepted' },
      { key: 'email', value: 'a@b.example' },
    ])
  })
  it('lists a creation\'s new values (before null) without a before side', () => {
    expect(auditDetailRows({ before: null, after: { role: 'reviewer', siteId: 4 }, via: 'invitation' })).toEqual([
      { key: 'role', value: 'reviewer' },
      { key: 'siteId', value: '4' },
      { key: 'via', value: 'invitation' },
    ])
  })
  it('shows a field only one side holds with a dash on the other', () => {
    expect(auditDetailRows({ before: { state: 'draft', assessmentId: null }, after: { state: 'submitted', assessmentId: 3 } })).toEqual([
      { key: 'state', before: 'draft', after: 'submitted' },
      { key: 'assessmentId', before: '—', after: '3' },
    ])
  })
  it('turns from/to into one change row, lists arrays and shows nothing for no details', () => {
    expect(auditDetailRows({ from: 'viewer', to: 'engineer' })).toEqual([{ key: 'change', before: 'viewer', after: 'engineer' }])
    expect(auditDetailRows({ fields: ['name', 'weir'] })).toEqual([{ key: 'fields', value: 'name, weir' }])
    expect(auditDetailRows(null)).toEqual([])
  })
})

describe('invitations', () => {
  const refusal = (statusCode: number, state?: string, message = 'said by the server') => ({ statusCode, data: { message, data: state ? { state } : undefined } })

  it('titles a closed invitation by why it closed, with the server\'s words', () => {
    expect(closedInvitation(refusal(410, 'expired', 'This invitation expired on 2026-03-01.'))).toEqual({ title: 'This invitation has expired', text: 'This invitation expired on 2026-03-01.', signIn: false })
    expect(closedInvitation(refusal(410, 'accepted')).signIn).toBe(true)
    expect(closedInvitation(refusal(410, 'revoked')).title).toBe('This invitation was withdrawn')
  })
  it('says the same for an unknown link whatever the server said', () => {
    expect(closedInvitation(refusal(404, undefined, 'not known')).title).toBe('This invitation link does not work')
    expect(closedInvitation(refusal(410, 'something-new')).title).toBe('This invitation link does not work')
  })
  it('sends a single-site reviewer to the site, anyone else to the portfolio', () => {
    expect(afterAcceptPath({ siteId: 5 })).toBe('/sites/5')
    expect(afterAcceptPath({ siteId: null })).toBe('/')
  })
  it('the invite form\'s single-site choice needs the reviewer role, as the schema says', () => {
    expect(InvitationInputSchema.safeParse({ email: 'x@y.example', role: 'viewer', siteId: 2 }).error!.issues[0]!.path).toEqual(['role'])
    expect(InvitationInputSchema.parse({ email: ' X@Y.example ', role: 'reviewer', siteId: 2 })).toEqual({ email: 'x@y.example', role: 'reviewer', siteId: 2 })
  })
})
