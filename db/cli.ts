// `npm run db:migrate` and `npm run db:seed`: the same migrations and seed the server uses,
// run against DATABASE_PATH (default .data/gillwatt.sqlite).
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { migrateToLatest, openDatabase } from './connection'
import { summaryPath } from '../shared/schemas/summaryLink'
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_SUMMARY_TOKEN } from './demo-scenario'
import { seedDemo } from './seed'

const path = process.env.DATABASE_PATH || '.data/gillwatt.sqlite'
const command = process.argv[2]

async function main() {
  const db = openDatabase(path)
  try {
    const level = await migrateToLatest(db)
    console.log(`Database ${path} is at migration ${level}.`)
    if (command === 'seed') {
      // Same driver and default options as nuxt-auth-utils' hashPassword, so the server verifies these.
      const hasher = new Hash(new Scrypt({}))
      const { created } = await seedDemo(db, (pw) => hasher.make(pw))
      console.log(created ? `Demo scenario loaded (${created} new records).` : 'Demo scenario already present; nothing changed.')
      console.log(`Demo accounts (password "${DEMO_PASSWORD}", demo only):`)
      for (const a of DEMO_ACCOUNTS) console.log(`  ${a.role.padEnd(9)} ${a.email.padEnd(34)} ${a.name}, ${a.story}`)
      const appUrl = (process.env.NUXT_PUBLIC_APP_URL || 'http://localhost:3000').replace(/\/+$/, '')
      console.log(`Demo summary link (demo-only fixed token, no sign-in): ${appUrl}${summaryPath(DEMO_SUMMARY_TOKEN)}`)
    } else if (command !== 'migrate') {
      throw new Error(`Unknown command "${command}". Use "migrate" or "seed".`)
    }
  } finally {
    await db.destroy()
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error)
  process.exit(1)
})
