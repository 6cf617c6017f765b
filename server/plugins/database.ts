// Opens the database and runs pending migrations as the server starts, and checks the
// session password: a production server must not start without one.
export default defineNitroPlugin(async (nitroApp) => {
  if (!import.meta.dev) {
    const password = useRuntimeConfig().session?.password ?? ''
    if (password.length < 32) {
      console.error('[gillwatt] NUXT_SESSION_PASSWORD must be set to at least 32 characters in production. Refusing to start.')
      process.exit(1)
    }
  }
  databaseReady().catch((error: unknown) => {
    console.error('[gillwatt] database migration failed:', error)
    process.exit(1)
  })
  nitroApp.hooks.hook('close', async () => {
    await useDb().destroy()
  })
})
