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
