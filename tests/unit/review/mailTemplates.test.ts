import nodemailer from 'nodemailer'
import { describe, expect, it } from 'vitest'
import { commentMentionMail } from '../../../server/domain/mail/templates/commentMention'
import { invitationMail } from '../../../server/domain/mail/templates/invitation'
import { escapeHtml } from '../../../server/domain/mail/templates/layout'
import { passwordResetMail } from '../../../server/domain/mail/templates/passwordReset'
import { reviewDecidedMail } from '../../../server/domain/mail/templates/reviewDecided'
import { reviewSubmittedMail } from '../../../server/domain/mail/templates/reviewSubmitted'
import { hashLinkToken, linkTokenMatches, newLinkToken } from '../../../server/domain/tokens'

const all = [
  invitationMail({ organisationName: 'Tarn & Beck', inviterName: 'Mo', roleLabel: 'Reviewer', siteName: 'Hollin <Mill>', link: 'http://app.example/invitations/abc', expiresAt: '2026-03-08T12:00:00.000Z' }),
  reviewSubmittedMail({ siteName: 'Hollin Mill', organisationName: 'Tarn & Beck', submitterName: 'Idris', optionName: 'Two units', resubmitted: true, note: 'See <August>', link: 'http://app.example/sites/1?tab=review' }),
  reviewDecidedMail({ siteName: 'Hollin Mill', deciderName: 'Elspeth', decisionLabel: 'Accepted with conditions', reason: 'Fine', conditions: 'Keep Q95 & monitor', link: 'http://app.example/sites/1?tab=review' }),
  commentMentionMail({ siteName: 'Hollin Mill', authorName: 'Elspeth', body: 'x'.repeat(700), pointsAt: 'August', link: 'http://app.example/sites/1?tab=review' }),
  passwordResetMail({ name: 'Idris', link: 'http://app.example/reset-password/abc', minutes: 60 }),
]

describe('mail templates', () => {
  it('give every e-mail a subject, a text body and an HTML body carrying the same link', () => {
    for (const m of all) {
      expect(m.subject.length).toBeGreaterThan(5)
      const link = /http:\/\/app\.example\/\S+/.exec(m.text)![0]
      expect(m.html).toContain(`href="${escapeHtml(link)}"`)
    }
  })

  it('escape what people typed in the HTML and keep it as typed in the text', () => {
    expect(all[0]!.html).toContain('Hollin &lt;Mill&gt;')
    expect(all[0]!.html).toContain('Tarn &amp; Beck')
    expect(all[1]!.text).toContain('> See <August>')
    expect(all[2]!.html).toContain('Keep Q95 &amp; monitor')
    expect(all[1]!.subject).toMatch(/^Resubmitted/)
  })

  it('shorten a long comment in the mention e-mail', () => {
    expect(all[3]!.text).toContain(`${'x'.repeat(600)}…`)
    expect(all[3]!.text).not.toContain('x'.repeat(601))
  })

  it('make well-formed messages with text and HTML parts (nodemailer jsonTransport)', async () => {
    const transport = nodemailer.createTransport({ jsonTransport: true })
    for (const m of all) {
      const info = await transport.sendMail({ from: 'Gillwatt <no-reply@gillwatt.example>', to: 'someone@test.example', ...m })
      const sent = JSON.parse(info.message as unknown as string)
      expect(sent.subject).toBe(m.subject)
      expect(sent.text).toBe(m.text)
      expect(sent.html).toBe(m.html)
      expect(info.envelope.to).toEqual(['someone@test.example'])
    }
  })
})

describe('link tokens', () => {
  it('are 128 random bits, URL-safe, never repeated', () => {
    const tokens = new Set(Array.from({ length: 200 }, newLinkToken))
    expect(tokens.size).toBe(200)
    for (const t of tokens) {
      expect(t).toMatch(/^[A-Za-z0-9_-]{22}$/)
      expect(Buffer.from(t, 'base64url')).toHaveLength(16)
    }
  })

  it('are stored as SHA-256 and compared against it', () => {
    // FIPS 180-2, appendix B.1: SHA-256("abc").
    expect(hashLinkToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad')
    const t = newLinkToken()
    expect(linkTokenMatches(t, hashLinkToken(t))).toBe(true)
    expect(linkTokenMatches(`${t}x`, hashLinkToken(t))).toBe(false)
    expect(linkTokenMatches(t, 'not-hex')).toBe(false)
  })
})
