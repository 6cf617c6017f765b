import { accountById, changePassword } from '~~/server/domain/accounts'
import { PasswordChangeSchema } from '#shared/schemas/account'

// Changes the signed-in person's password, given the current one. Every session of the account
// ends (a cookie copied earlier is worth nothing) and this browser gets a fresh one.
// Signed-in only; small body; wrong current passwords count towards the sign-in throttle.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { currentPassword, newPassword } = await readValidatedJson(event, PasswordChangeSchema, BODY_LIMITS.public)
  const keys = signInKeys(event, user.email)
  await assertNotThrottled(event, keys)
  const account = await accountById(useDb(), user.id)
  if (!(await verifyPassword(account.password_hash, currentPassword))) {
    await recordHit(keys)
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'currentPassword: is not your current password', data: { issues: [{ path: 'currentPassword', message: 'is not your current password' }] } })
  }
  const passwordHash = await hashPassword(newPassword)
  const ended = await changePassword(useDb(), user.id, passwordHash)
  await startSession(event, { id: account.id, email: account.email, name: account.name })
  await audit({ orgId: null, userId: user.id, action: 'password.changed', targetType: 'user', targetId: user.id, detail: { sessionsEnded: ended } })
  return { ok: true, message: 'Your password has been changed. Every other browser signed in to your account has been signed out.' }
})
