import type { Kysely } from 'kysely'
import type { Database } from './schema'
import { DEMO_ACCOUNTS, DEMO_ORGANISATION, DEMO_PASSWORD } from './demo-scenario'

/** Hashes a password the same way the server does (nuxt-auth-utils' scrypt). */
export type PasswordHasher = (password: string) => Promise<string>

/**
 * Loads the invented demo scenario. Safe to run twice: people are matched by e-mail and the
 * organisation by name, and nothing already there is changed or duplicated.
 */
export async function seedDemo(db: Kysely<Database>, hash: PasswordHasher): Promise<{ orgId: number; created: number }> {
  const passwordHash = await hash(DEMO_PASSWORD)
  return db.transaction().execute(async (trx) => {
    let created = 0
    let org = await trx.selectFrom('organisations').select('id').where('name', '=', DEMO_ORGANISATION).executeTakeFirst()
    if (!org) {
      org = await trx.insertInto('organisations').values({ name: DEMO_ORGANISATION }).returning('id').executeTakeFirstOrThrow()
      created++
    }
    for (const account of DEMO_ACCOUNTS) {
      let user = await trx.selectFrom('users').select('id').where('email', '=', account.email).executeTakeFirst()
      if (!user) {
        user = await trx
          .insertInto('users')
          .values({ email: account.email, name: account.name, password_hash: passwordHash })
          .returning('id')
          .executeTakeFirstOrThrow()
        created++
      }
      await trx
        .insertInto('memberships')
        .values({ user_id: user.id, org_id: org.id, role: account.role })
        .onConflict((oc) => oc.columns(['user_id', 'org_id']).doNothing())
        .execute()
    }
    if (created) {
      await trx.insertInto('audit_log').values({ org_id: org.id, user_id: null, action: 'demo.seeded', detail: JSON.stringify({ accounts: DEMO_ACCOUNTS.length }) }).execute()
    }
    return { orgId: org.id, created }
  })
}
