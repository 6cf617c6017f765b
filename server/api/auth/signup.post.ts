import { signupExistsMail } from '../../domain/mail/templates/verifyEmail'
import { SignupSchema } from '../../../shared/schemas/auth'
import type { SignupAnswer } from '../../../shared/schemas/account'

const MESSAGE = 'Check your e-mail: we have sent a message to that address. To confirm it is yours, open the link in it. You can sign in now with the password you chose.'

// Creates a person and their first organisation (they become its admin), unconfirmed until they
// open the link e-mailed to them. An address that already has an account gets the same answer,
// after the same work; its owner is told by e-mail instead. Nobody is signed in here: the form
// signs in next with the same password, so a taken address reveals nothing more than a wrong
// password would. Open to anyone: small body, throttled per client address.
export default defineEventHandler(async (event): Promise<SignupAnswer> => {
  const input = await readValidatedJson(event, SignupSchema, BODY_LIMITS.public)
  const address: [ThrottleBucket, string][] = [['sign-up-address', clientAddress(event)]]
  await assertNotThrottled(event, address)
  await recordHit(address)
  const passwordHash = await hashPassword(input.password)
  const db = useDb()
  const taken = await db.selectFrom('users').select(['id', 'name', 'email']).where('email', '=', input.email).executeTakeFirst()
  if (taken) {
    const { delivery } = await queueMail({ to: taken.email, ...signupExistsMail({ name: taken.name, resetLink: appLink('/reset-password') }), kind: 'signup-exists', orgId: null })
    void delivery.catch((error: unknown) => console.error('sign-up mail: recording the delivery failed', error))
    await audit({ orgId: null, userId: taken.id, action: 'signup.address-taken', targetType: 'user', targetId: taken.id, detail: undefined })
  } else {
    // Two sign-ups racing for one address: the loser's insert breaks the unique e-mail and it is
    // answered like any taken address.
    const created = await db.transaction().execute(async (trx) => {
      const user = await trx.insertInto('users').values({ email: input.email, name: input.name, password_hash: passwordHash }).returning(['id', 'email', 'name']).executeTakeFirstOrThrow()
      const org = await trx.insertInto('organisations').values({ name: input.organisationName }).returning('id').executeTakeFirstOrThrow()
      await trx.insertInto('memberships').values({ user_id: user.id, org_id: org.id, role: 'admin' }).execute()
      await trx.updateTable('users').set({ last_org_id: org.id }).where('id', '=', user.id).execute()
      return { user, orgId: org.id }
    }).catch((error: unknown) => {
      if (String((error as { code?: unknown }).code ?? '').startsWith('SQLITE_CONSTRAINT')) return null
      throw error
    })
    if (created) {
      const { user, orgId } = created
      await audit({ orgId, userId: user.id, action: 'organisation.created', targetType: 'organisation', targetId: orgId, detail: { name: input.organisationName } })
      await sendVerification(user)
    }
  }
  setResponseStatus(event, 202)
  return { message: MESSAGE }
})
