import { renderMail, type RenderedMail } from './layout'

/** To the site's reviewers: a site is waiting for their review. */
export function reviewSubmittedMail(v: {
  siteName: string
  organisationName: string
  submitterName: string | null
  optionName: string
  resubmitted: boolean
  note: string | null
  link: string
}): RenderedMail {
  const who = v.submitterName ?? 'A project engineer'
  return renderMail(`${v.resubmitted ? 'Resubmitted' : 'Submitted'} for review: ${v.siteName}`, 'Hello,', [
    { p: `${who} of ${v.organisationName} has ${v.resubmitted ? 'resubmitted' : 'submitted'} ${v.siteName} for your review, with the assessment of the option “${v.optionName}”.` },
    ...(v.note ? [{ quote: v.note, label: 'Their note' }] : []),
    { p: 'The review brief sets out the reserved flow kept in the river, oxygen by month with and without the scheme against the target, the net gain at summer low flow and the gas-supersaturation check.' },
    { link: v.link, label: 'Open the review' },
  ])
}
