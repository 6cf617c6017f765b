import { signUp } from '~~/server/domain/accounts'
import { sendVerification } from '~~/server/domain/verification'
import { SignupSchema } from '#shared/schemas/auth'
import type { SignupAnswer } from '#shared/schemas/account'

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
  const mailer = useMailer()
  const outcome = await signUp(useDb(), { email: input.email, name: input.name, organisationName: input.organisationName, passwordHash, mailer })
  if (outcome.kind === 'taken') {
    await audit({ orgId: null, userId: outcome.userId, action: 'signup.address-taken', targetType: 'user', targetId: outcome.userId, detail: undefined })
  } else if (outcome.kind === 'created') {
    const { user, orgId } = outcome
    await audit({ orgId, userId: user.id, action: 'organisation.created', targetType: 'organisation', targetId: orgId, detail: { name: input.organisationName } })
    await sendVerification(useDb(), { user, now: Date.now(), mailer })
  }
  setResponseStatus(event, 202)
  return { message: MESSAGE }
})
