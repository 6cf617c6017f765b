import { renderMail, type RenderedMail } from './layout'

/** To the submitter and the site's engineers: the reviewer has decided. */
export function reviewDecidedMail(v: {
  siteName: string
  deciderName: string | null
  decisionLabel: string
  reason: string
  conditions: string | null
  /** "requires: flood-risk permit granted", or '' for none. */
  requires?: string
  link: string
}): RenderedMail {
  const who = v.deciderName ?? 'The reviewer'
  return renderMail(`${v.siteName}: ${v.decisionLabel.toLowerCase()}`, 'Hello,', [
    { p: `${who} has recorded a decision on ${v.siteName}: ${v.decisionLabel.toLowerCase()}.` },
    { quote: v.reason, label: 'Reason' },
    ...(v.conditions ? [{ quote: v.conditions, label: 'Conditions' }] : []),
    ...(v.requires ? [{ p: `The decision ${v.requires}.` }] : []),
    { link: v.link, label: 'Open the review' },
  ])
}
