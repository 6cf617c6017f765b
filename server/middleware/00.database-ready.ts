// Requests wait for migrations to finish (instant once they have).
export default defineEventHandler(async () => {
  await databaseReady()
})
