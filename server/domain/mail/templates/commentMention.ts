import { renderMail, type RenderedMail } from './layout'

const EXCERPT_MAX = 600

/** To a member mentioned in a comment. */
export function commentMentionMail(v: { siteName: string; authorName: string | null; body: string; pointsAt: string | null; link: string }): RenderedMail {
  const who = v.authorName ?? 'Someone'
  const excerpt = v.body.length > EXCERPT_MAX ? `${v.body.slice(0, EXCERPT_MAX)}…` : v.body
  return renderMail(`${who} mentioned you on ${v.siteName}`, 'Hello,', [
    { p: `${who} mentioned you in a comment on ${v.siteName}${v.pointsAt ? ` (about ${v.pointsAt})` : ''}.` },
    { quote: excerpt },
    { link: v.link, label: 'Read the thread' },
  ])
}
