import { renderMail, mailDate, type RenderedMail } from './layout'

/** Invitation to join an organisation, or to review one site of it. */
export function invitationMail(v: {
  organisationName: string
  inviterName: string | null
  roleLabel: string
  siteName: string | null
  link: string
  expiresAt: string
}): RenderedMail {
  const who = v.inviterName ?? 'An administrator'
  const what = v.siteName
    ? `${who} of ${v.organisationName} asks you to review one site in Gillwatt: ${v.siteName}. You will be able to read that site, its hydrology, design options and assessments, comment on it and record your decision.`
    : `${who} invites you to join ${v.organisationName} in Gillwatt as ${v.roleLabel.toLowerCase()}.`
  return renderMail(v.siteName ? `Review ${v.siteName} for ${v.organisationName}` : `Join ${v.organisationName} on Gillwatt`, 'Hello,', [
    { p: what },
    { link: v.link, label: 'Open the invitation' },
    { p: `The link works once and until ${mailDate(v.expiresAt)}. If you were not expecting it, you can leave this e-mail unanswered and nothing will change.` },
  ])
}
