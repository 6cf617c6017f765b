import type { Me } from '../../shared/schemas/auth'

/** The user's organisations and roles, by organisation name. */
export async function membershipsOf(userId: number): Promise<Me['memberships']> {
  return useDb()
    .selectFrom('memberships')
    .innerJoin('organisations', 'organisations.id', 'memberships.org_id')
    .select(['organisations.id as orgId', 'organisations.name as orgName', 'memberships.role as role'])
    .where('memberships.user_id', '=', userId)
    .orderBy('organisations.name')
    .execute()
}

/** What GET /api/me answers: the person, whether their address is confirmed, their organisations. */
export async function meOf(userId: number): Promise<Me> {
  const row = await useDb().selectFrom('users').select(['id', 'email', 'name', 'email_verified_at', 'last_org_id']).where('id', '=', userId).executeTakeFirst()
  if (!row) throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'Sign in to continue' })
  return {
    user: { id: row.id, email: row.email, name: row.name },
    emailVerifiedAt: row.email_verified_at,
    lastOrgId: row.last_org_id,
    memberships: await membershipsOf(userId),
  }
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
