import { mkdirSync } from 'node:fs'
import { dirname } from 'node:path'
import Database from 'better-sqlite3'
import { count, type SQL } from 'drizzle-orm'
import type { SQLiteTable } from 'drizzle-orm/sqlite-core'
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3'
import * as schema from '../../db/schema'

export { schema as tables }

export type Db = BetterSQLite3Database<typeof schema>

let instance: { db: Db, sqlite: Database.Database } | undefined

// One connection for the process: better-sqlite3 is synchronous, so sharing it is safe.
export function useDb(): Db {
  return openDatabase().db
}

export function useSqlite(): Database.Database {
  return openDatabase().sqlite
}

function openDatabase() {
  if (!instance) {
    const path = databasePath()
    if (path !== ':memory:') mkdirSync(dirname(path), { recursive: true })
    const sqlite = new Database(path)
    sqlite.pragma('journal_mode = WAL')
    sqlite.pragma('foreign_keys = ON')
    sqlite.pragma('busy_timeout = 5000')
    instance = { sqlite, db: drizzle(sqlite, { schema }) }
  }
  return instance
}

export function closeDatabase() {
  instance?.sqlite.close()
  instance = undefined
}

export function countRows(table: SQLiteTable, where?: SQL) {
  return useDb().select({ n: count() }).from(table).where(where).get()?.n ?? 0
}
