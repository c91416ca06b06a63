import { isAbsolute, resolve } from 'node:path'

// DATABASE_URL and UPLOADS_DIR are the names a deployer expects; NUXT_DATABASE_URL and
// NUXT_UPLOADS_DIR work too through runtime config. Relative paths are taken from the working directory.
export function databasePath() {
  const value = process.env.DATABASE_URL || useRuntimeConfig().databaseUrl
  const path = value.replace(/^file:/, '')
  return path === ':memory:' ? path : toAbsolute(path)
}

export function uploadsDir() {
  return toAbsolute(process.env.UPLOADS_DIR || useRuntimeConfig().uploads.dir)
}

export function migrationsDir() {
  return toAbsolute(useRuntimeConfig().migrationsDir)
}

function toAbsolute(path: string) {
  return isAbsolute(path) ? path : resolve(process.cwd(), path)
}
