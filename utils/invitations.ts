// Pure helpers of the invitation pages: where to go after accepting, and the words for a link that
// cannot be used.
import { httpStatus } from './serverErrors'
import type { InvitationAcceptedDto } from '#shared/schemas/invitation'

/** Where to go after accepting: the one site for a single-site reviewer, else the portfolio. */
export function afterAcceptPath(accepted: Pick<InvitationAcceptedDto, 'siteId'>): string {
  return accepted.siteId !== null ? `/sites/${accepted.siteId}` : '/'
}

/** The heading and words for an invitation link that cannot be used, from the server's refusal. */
export function closedInvitation(error: unknown): { title: string; text: string; signIn: boolean } {
  const e = error as { data?: { message?: string; data?: { state?: string } } } | null
  const state = e?.data?.data?.state
  const said = e?.data?.message
  const titles: Record<string, string> = {
    expired: 'This invitation has expired',
    accepted: 'This invitation has already been used',
    revoked: 'This invitation was withdrawn',
    'site-removed': 'The site of this invitation has been removed',
  }
  if (httpStatus(error) === 410 && state && titles[state]) {
    return { title: titles[state]!, text: said ?? 'Ask the administrator who sent it for a new one.', signIn: state === 'accepted' }
  }
  return {
    title: 'This invitation link does not work',
    text: 'Check that the whole link was copied from the e-mail. If it still does not work, ask the person who invited you to send a new one.',
    signIn: false,
  }
}
