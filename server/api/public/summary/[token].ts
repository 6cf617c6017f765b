import { z } from 'zod'
import { openSummary, summaryLinkByToken } from '~~/server/domain/summaryLinks'
import type { PublicSummaryDto } from '#shared/schemas/summaryLink'

// GET /api/public/summary/[token]: the landowner summary behind a summary link: no sign-in,
// read-only, only what PublicSummaryDto lists. An unknown, malformed, expired or revoked token, or a
// deleted site, all get the same 404. This one file takes every method (no .get suffix) so that any
// write answers 405 here instead of falling through to the page renderer.
const Params = z.object({ token: z.string().max(200).optional() })

const gone = () => createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This summary link does not work. It may have expired or been withdrawn; ask whoever sent it for a new one.' })

export default defineEventHandler(async (event): Promise<PublicSummaryDto> => {
  if (event.method !== 'GET' && event.method !== 'HEAD') {
    setResponseHeader(event, 'Allow', 'GET, HEAD')
    throw createError({ statusCode: 405, statusMessage: 'Method Not Allowed', message: 'A summary is read-only: only GET is allowed' })
  }
  // The token is a secret in the address: keep it out of caches, referrers and search engines.
  setResponseHeaders(event, { 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer', 'X-Robots-Tag': 'noindex, nofollow' })
  const parsed = Params.safeParse(getRouterParams(event, { decode: true }))
  const token = parsed.success ? parsed.data.token : undefined
  if (!token) throw gone()
  // Someone guessing tokens is slowed like any other guesser of links (per client address).
  const linkKeys: [ThrottleBucket, string][] = [['link-address', clientAddress(event)]]
  await assertNotThrottled(event, linkKeys)
  const db = useDb()
  const link = await summaryLinkByToken(db, token)
  if (!link) {
    await recordHit(linkKeys)
    throw gone()
  }
  const summary = await openSummary(db, link, nowIso(), event.method === 'GET')
  if (!summary) throw gone()
  return summary
})
