import { loadMe } from '../domain/accounts'
import type { Me } from '../../shared/schemas/auth'

/** What GET /api/me answers (server/domain/accounts.ts loadMe); 401 when the account is gone. */
export async function meOf(userId: number): Promise<Me> {
  const me = await loadMe(useDb(), userId)
  if (!me) throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'Sign in to continue' })
  return me
}

let dummy: Promise<string> | undefined
/**
 * A password hash that matches nothing, made once: sign-in checks an unknown e-mail's password
 * against it, so a known and an unknown e-mail take the same time to answer.
 */
export function dummyPasswordHash(): Promise<string> {
  dummy ??= hashPassword(`no-account-${Math.random()}-${Date.now()}`)
  return dummy
}
