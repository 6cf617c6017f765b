import { LATEST_MIGRATION } from '~~/db/migrations'
import { currentMigration, pingDatabase } from '~~/db/connection'
import { ENGINE_VERSION } from '#shared/engine/version'

// Liveness for operators: the database answers, its migration level, and the engine version.
export default defineEventHandler(async (event) => {
  const db = useDb()
  try {
    await pingDatabase(db)
  } catch (error) {
    setResponseStatus(event, 503)
    return { ok: false, database: 'unreachable', error: String(error) }
  }
  const migration = await currentMigration(db)
  return {
    ok: migration === LATEST_MIGRATION,
    database: 'ok',
    migration,
    latestMigration: LATEST_MIGRATION,
    engineVersion: ENGINE_VERSION,
  }
})
