// The review comment thread's pure helpers: the tags a comment may carry, the body the form sends,
// and @mentions while typing and when shown.
import { monthName } from '#shared/utils/months'
import type { FlagId } from '#shared/engine/results'
import type { CommentDto, CommentInput } from '#shared/schemas/review'
import { FLAG_IDS } from '#shared/schemas/review'
import { FLAG_TITLES } from './assessment'

/** The flags offered in the comment form, in the schema's order. */
export const COMMENT_FLAG_CHOICES = FLAG_IDS.map((id) => ({ value: id, label: FLAG_TITLES[id] }))

/** What a comment is about, as short tags ("Assessment 12", "August", "Gas supersaturation"). */
export function commentTags(c: Pick<CommentDto, 'assessmentId' | 'month' | 'flagId'>): string[] {
  const tags: string[] = []
  if (c.assessmentId !== null) tags.push(`Assessment ${c.assessmentId}`)
  if (c.month !== null) tags.push(monthName(c.month))
  if (c.flagId !== null) tags.push(FLAG_TITLES[c.flagId] ?? c.flagId)
  return tags
}

/** A comment form's values as the body the server takes: empty selects are left out. */
export function commentBody(v: { body: string; assessmentId: number | '' ; month: number | ''; flagId: FlagId | '' }): CommentInput {
  return {
    body: v.body,
    ...(v.assessmentId !== '' ? { assessmentId: v.assessmentId } : {}),
    ...(v.month !== '' ? { month: v.month } : {}),
    ...(v.flagId !== '' ? { flagId: v.flagId } : {}),
  }
}

/** The `@word` being typed at the end of the text, without the `@`; null when the text does not end in one. */
export function mentionBeingTyped(text: string): string | null {
  const m = /(?:^|\s)@([^\s@]*)$/.exec(text)
  return m ? m[1]! : null
}

const escapeRegExp = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')

/**
 * Splits a comment body into plain text and mention parts, so mentions can be set apart: `@` and one
 * of `names` (the people the server found mentioned; any case), or `@` and an e-mail address.
 */
export function splitMentions(text: string, names: readonly string[]): { text: string; mention: boolean }[] {
  const alternatives = [...names.filter((n) => n.trim()).map((n) => escapeRegExp(n.trim())).sort((a, b) => b.length - a.length), '[^\\s@]+@[^\\s@]+\\.[^\\s@.,;:!?()]+']
  const re = new RegExp(`(^|[^\\w.@])(@(?:${alternatives.join('|')}))(?![\\w@-])`, 'giu')
  const parts: { text: string; mention: boolean }[] = []
  let last = 0
  for (const m of text.matchAll(re)) {
    const start = m.index + m[1]!.length
    if (start > last) parts.push({ text: text.slice(last, start), mention: false })
    parts.push({ text: m[2]!, mention: true })
    last = start + m[2]!.length
  }
  if (last < text.length) parts.push({ text: text.slice(last), mention: false })
  return parts
}
