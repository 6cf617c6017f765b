import type { H3Event } from 'h3'
import type { InvitationRow } from '../../db/schema'
import { invitationByTokenIn } from '../domain/invitations'

/** The same neutral 404 for every token nobody issued. */
const unknownInvitation = () => createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This invitation link is not known. Check that the whole link was copied.' })

/**
 * The invitation a token stands for, whatever its state; a neutral 404 when none. Unknown tokens
 * count towards the per-address link throttle (429 once someone is guessing).
 */
export async function invitationByToken(event: H3Event, token: string): Promise<InvitationRow> {
  const keys: [ThrottleBucket, string][] = [['link-address', clientAddress(event)]]
  await assertNotThrottled(event, keys)
  const row = await invitationByTokenIn(useDb(), token)
  if (!row) {
    await recordHit(keys)
    throw unknownInvitation()
  }
  return row
}
