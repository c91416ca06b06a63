import { count } from 'drizzle-orm'
import type { BetterSQLite3Database } from 'drizzle-orm/better-sqlite3'
import { z } from 'zod'
import * as schema from '../../db/schema'
import { CURRENCIES } from '../../shared/utils/currencies'
import { emailField, newPasswordField } from './schemas'

// The first workshop and its owner, created by the setup page or by `npm run setup` on a database
// started without the demo. Plain imports only (no Nitro auto-imports): the command runs outside
// the server.

type AnyDb = BetterSQLite3Database<typeof schema>

export const firstRunFields = z.object({
  workshopName: z.string().trim().min(2, 'give the workshop a name of at least 2 characters').max(120, 'keep the workshop name under 120 characters'),
  currency: z.enum(CURRENCIES, { message: `choose the currency the workshop prices in (${CURRENCIES.join(', ')})` }),
  ownerName: z.string().trim().min(1, 'enter your name').max(100, 'keep your name under 100 characters'),
  email: emailField,
  password: newPasswordField,
}).strict()

export type FirstRunInput = z.infer<typeof firstRunFields>

export const SETUP_CLOSED_MESSAGE = 'This Densitas already has a workshop, so setup is closed. Sign in, or ask the workshop owner for an invitation.'

export class SetupClosedError extends Error {
  constructor() {
    super(SETUP_CLOSED_MESSAGE)
    this.name = 'SetupClosedError'
  }
}

export function isSetupOpen(db: AnyDb) {
  return (db.select({ n: count() }).from(schema.workshops).get()?.n ?? 0) === 0
}

// A URL-safe name for the workshop; unique because it is the only workshop.
export function workshopSlug(name: string) {
  const slug = name.normalize('NFKD').replace(/[\u0300-\u036F]/g, '').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60)
  return slug || 'workshop'
}

// One IMMEDIATE transaction: it takes the write lock before looking, so of two setups running at
// once (two browsers, or the page and the command in another process) exactly one finds the
// database empty and the other gets SetupClosedError. Nothing is half-written.
export function createFirstWorkshop(db: AnyDb, input: Omit<FirstRunInput, 'password'>, passwordHash: string) {
  return db.transaction((tx) => {
    if ((tx.select({ n: count() }).from(schema.workshops).get()?.n ?? 0) > 0) throw new SetupClosedError()
    const workshop = tx.insert(schema.workshops).values({ name: input.workshopName, slug: workshopSlug(input.workshopName), currency: input.currency }).returning().get()
    const owner = tx.insert(schema.users).values({ workshopId: workshop.id, email: input.email, name: input.ownerName, passwordHash, role: 'owner' }).returning().get()
    // The same row recordAudit writes; written directly because recordAudit relies on Nitro's auto-imports.
    tx.insert(schema.auditEvents).values({ workshopId: workshop.id, userId: owner.id, action: 'set-up', entity: 'workshop', entityId: workshop.id, detail: { currency: input.currency } }).run()
    return { workshop, owner }
  }, { behavior: 'immediate' })
}
