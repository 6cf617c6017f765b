// `npm run db:migrate` and `npm run db:seed`: the same migrations and seed the server uses,
// run against DATABASE_PATH (default .data/gillwatt.sqlite).
// `npm run db:backup [file]`: an online copy of DATABASE_PATH (the server may keep running), by default
// to .data/backups/gillwatt-<UTC timestamp>.sqlite. `npm run db:restore <file>`: puts a backup in place
// of DATABASE_PATH with the server stopped, keeping the replaced file as <path>.before-restore-<timestamp>.
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { backupDatabase, defaultBackupPath, restoreDatabase } from './backup'
import { migrateToLatest, openDatabase } from './connection'
import { summaryPath } from '../shared/schemas/summaryLink'
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_SUMMARY_TOKEN } from './demo-scenario'
import { seedDemo } from './seed'

const path = process.env.DATABASE_PATH || '.data/gillwatt.sqlite'
const command = process.argv[2]

const megabytes = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(2)} MB`

async function main() {
  if (!['migrate', 'seed', 'backup', 'restore'].includes(command ?? '')) {
    throw new Error(`Unknown command "${command ?? ''}". Use "migrate", "seed", "backup [file]" or "restore <file>".`)
  }
  // Backup and restore never migrate: a backup copies the file as it is, a restore checks its input.
  if (command === 'backup') {
    const report = await backupDatabase(path, process.argv[3] || defaultBackupPath())
    console.log(`Backed up ${path} to ${report.path}: ${report.pages} pages of ${report.pageSize} bytes, ${megabytes(report.bytes)}, integrity ok, migration ${report.migration}.`)
    return
  }
  if (command === 'restore') {
    const file = process.argv[3]
    if (!file) throw new Error('restore: name the backup file, e.g. npm run db:restore -- .data/backups/gillwatt-20260101T000000000Z.sqlite')
    const report = await restoreDatabase(file, path)
    console.log(`Restored ${report.path} from ${file}: ${report.pages} pages, ${megabytes(report.bytes)}, integrity ok, migration ${report.migration}.`)
    console.log(report.keptAs ? `The replaced database is kept as ${report.keptAs}.` : 'There was no database to replace.')
    return
  }
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
    }
  } finally {
    await db.destroy()
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error)
  process.exit(1)
})
