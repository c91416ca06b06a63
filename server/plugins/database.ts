import { migrate } from 'drizzle-orm/better-sqlite3/migrator'

// Bring the schema up to date before the first request, then seed the demo workshops on an
// empty database unless NUXT_SEED_DEMO=false (production).
export default defineNitroPlugin(async (nitroApp) => {
  const db = useDb()
  migrate(db, { migrationsFolder: migrationsDir() })
  if (useRuntimeConfig().seedDemo) {
    await seedDemoIfEmpty(db)
  }
  nitroApp.hooks.hook('close', () => closeDatabase())
})
