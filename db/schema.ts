import { sql } from 'drizzle-orm'
import { index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core'
import { ROLES } from '../shared/utils/roles'

// Every feature table carries workshop_id so a query can always be scoped with one WHERE.
// Timestamps are unix epoch milliseconds (integer, mode 'timestamp_ms').

const createdAt = () => integer('created_at', { mode: 'timestamp_ms' }).notNull().default(sql`(unixepoch('subsec') * 1000)`)

export const FUELS = ['diesel', 'petrol'] as const
export const LOG_STATUSES = ['analysed', 'failed'] as const
export const QUOTE_STATUSES = ['draft', 'sent', 'accepted', 'declined', 'deposit_paid', 'in_progress', 'done', 'cancelled'] as const
export const PAYMENT_STATUSES = ['pending', 'succeeded', 'failed', 'refunded'] as const
export const OUTBOX_STATUSES = ['queued', 'sent', 'failed'] as const

export const workshops = sqliteTable('workshops', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull(),
  slug: text('slug').notNull().unique(),
  currency: text('currency').notNull().default('EUR'),
  // Prices the owner keeps: labour per hour and the deposit share of a quote.
  labourRateCents: integer('labour_rate_cents').notNull().default(9000),
  depositPercent: integer('deposit_percent').notNull().default(30),
  createdAt: createdAt(),
})

export const users = sqliteTable('users', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash').notNull(),
  role: text('role', { enum: ROLES }).notNull(),
  // Display units only; results stay SI. { temperature: 'C' | 'F', pressure: 'kPa' | 'bar' | 'psi', power: 'kW' | 'hp' | 'PS' }
  preferences: text('preferences', { mode: 'json' }).$type<Record<string, string>>().notNull().default({}),
  createdAt: createdAt(),
}, t => [index('users_workshop_idx').on(t.workshopId)])

export const invites = sqliteTable('invites', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  email: text('email').notNull(),
  role: text('role', { enum: ROLES }).notNull(),
  // Only a SHA-256 of the token is kept: a leaked database does not leak working links.
  tokenHash: text('token_hash').notNull().unique(),
  invitedById: integer('invited_by_id').references(() => users.id, { onDelete: 'set null' }),
  expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
  acceptedAt: integer('accepted_at', { mode: 'timestamp_ms' }),
  createdAt: createdAt(),
}, t => [index('invites_workshop_idx').on(t.workshopId)])

export const passwordResets = sqliteTable('password_resets', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  userId: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  tokenHash: text('token_hash').notNull().unique(),
  expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
  usedAt: integer('used_at', { mode: 'timestamp_ms' }),
  createdAt: createdAt(),
})

export const cores = sqliteTable('cores', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  kind: text('kind', { enum: ['stock', 'front-mount', 'top-mount', 'air-to-water'] }).notNull(),
  faceWidthMm: integer('face_width_mm').notNull(),
  faceHeightMm: integer('face_height_mm').notNull(),
  depthMm: integer('depth_mm').notNull(),
  // Heat conductance from a measured log or the maker's data, if known (W/K).
  uaWPerK: real('ua_w_per_k'),
  priceCents: integer('price_cents'),
  notes: text('notes').notNull().default(''),
  createdAt: createdAt(),
}, t => [index('cores_workshop_idx').on(t.workshopId)])

export const vehicles = sqliteTable('vehicles', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  ownerId: integer('owner_id').notNull().references(() => users.id, { onDelete: 'restrict' }),
  description: text('description').notNull(),
  registration: text('registration').notNull().default(''),
  displacementL: real('displacement_l').notNull(),
  cylinders: integer('cylinders').notNull(),
  fuel: text('fuel', { enum: FUELS }).notNull(),
  ratedPowerKw: real('rated_power_kw'),
  fittedCoreId: integer('fitted_core_id').references(() => cores.id, { onDelete: 'set null' }),
  notes: text('notes').notNull().default(''),
  createdAt: createdAt(),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' }),
}, t => [index('vehicles_workshop_idx').on(t.workshopId), index('vehicles_owner_idx').on(t.ownerId)])

// A saved column mapping, offered again when a file with the same header arrives.
export const logProfiles = sqliteTable('log_profiles', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  headerSignature: text('header_signature').notNull(),
  mapping: text('mapping', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
}, t => [uniqueIndex('log_profiles_name_uq').on(t.workshopId, t.name), index('log_profiles_sig_idx').on(t.workshopId, t.headerSignature)])

export const logs = sqliteTable('logs', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  vehicleId: integer('vehicle_id').notNull().references(() => vehicles.id, { onDelete: 'cascade' }),
  uploadedById: integer('uploaded_by_id').references(() => users.id, { onDelete: 'set null' }),
  originalName: text('original_name').notNull(),
  sizeBytes: integer('size_bytes').notNull(),
  sha256: text('sha256').notNull(),
  mapping: text('mapping', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  // What the user entered for what the file lacks: ambient, altitude or baro, humidity.
  conditions: text('conditions', { mode: 'json' }).$type<Record<string, number | null>>().notNull().default({}),
  pullEdits: text('pull_edits', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default({}),
  status: text('status', { enum: LOG_STATUSES }).notNull(),
  rowCount: integer('row_count').notNull().default(0),
  durationS: real('duration_s').notNull().default(0),
  recordedOn: text('recorded_on'),
  notes: text('notes').notNull().default(''),
  createdAt: createdAt(),
}, t => [index('logs_workshop_idx').on(t.workshopId), index('logs_vehicle_idx').on(t.vehicleId)])

export const analyses = sqliteTable('analyses', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  logId: integer('log_id').notNull().unique().references(() => logs.id, { onDelete: 'cascade' }),
  engineVersion: text('engine_version').notNull(),
  result: text('result', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  createdAt: createdAt(),
})

export const comparisons = sqliteTable('comparisons', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  vehicleId: integer('vehicle_id').notNull().references(() => vehicles.id, { onDelete: 'cascade' }),
  beforeLogId: integer('before_log_id').notNull().references(() => logs.id, { onDelete: 'cascade' }),
  afterLogId: integer('after_log_id').notNull().references(() => logs.id, { onDelete: 'cascade' }),
  result: text('result', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  recommendation: text('recommendation').notNull().default(''),
  createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
}, t => [index('comparisons_workshop_idx').on(t.workshopId)])

export const quotes = sqliteTable('quotes', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  vehicleId: integer('vehicle_id').notNull().references(() => vehicles.id, { onDelete: 'cascade' }),
  customerId: integer('customer_id').notNull().references(() => users.id, { onDelete: 'restrict' }),
  coreId: integer('core_id').references(() => cores.id, { onDelete: 'set null' }),
  status: text('status', { enum: QUOTE_STATUSES }).notNull().default('draft'),
  currency: text('currency').notNull(),
  totalCents: integer('total_cents').notNull().default(0),
  depositCents: integer('deposit_cents').notNull().default(0),
  sizing: text('sizing', { mode: 'json' }).$type<Record<string, unknown>>(),
  notes: text('notes').notNull().default(''),
  createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
  sentAt: integer('sent_at', { mode: 'timestamp_ms' }),
  acceptedAt: integer('accepted_at', { mode: 'timestamp_ms' }),
  createdAt: createdAt(),
}, t => [index('quotes_workshop_idx').on(t.workshopId), index('quotes_customer_idx').on(t.customerId)])

export const quoteLines = sqliteTable('quote_lines', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  quoteId: integer('quote_id').notNull().references(() => quotes.id, { onDelete: 'cascade' }),
  position: integer('position').notNull(),
  description: text('description').notNull(),
  quantity: real('quantity').notNull(),
  unitPriceCents: integer('unit_price_cents').notNull(),
})

export const payments = sqliteTable('payments', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  quoteId: integer('quote_id').notNull().references(() => quotes.id, { onDelete: 'cascade' }),
  provider: text('provider').notNull(),
  providerRef: text('provider_ref').notNull().unique(),
  amountCents: integer('amount_cents').notNull(),
  currency: text('currency').notNull(),
  status: text('status', { enum: PAYMENT_STATUSES }).notNull(),
  createdAt: createdAt(),
})

// Every e-mail the product sends is written here first; a sender delivers it (SMTP sink by default).
export const outbox = sqliteTable('outbox', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').references(() => workshops.id, { onDelete: 'cascade' }),
  toEmail: text('to_email').notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
  kind: text('kind').notNull(),
  status: text('status', { enum: OUTBOX_STATUSES }).notNull().default('queued'),
  error: text('error'),
  sentAt: integer('sent_at', { mode: 'timestamp_ms' }),
  createdAt: createdAt(),
}, t => [index('outbox_workshop_idx').on(t.workshopId)])

export const shareLinks = sqliteTable('share_links', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  logId: integer('log_id').notNull().references(() => logs.id, { onDelete: 'cascade' }),
  tokenHash: text('token_hash').notNull().unique(),
  createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
  expiresAt: integer('expires_at', { mode: 'timestamp_ms' }),
  revokedAt: integer('revoked_at', { mode: 'timestamp_ms' }),
  createdAt: createdAt(),
})

export const auditEvents = sqliteTable('audit_events', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').references(() => workshops.id, { onDelete: 'cascade' }),
  userId: integer('user_id').references(() => users.id, { onDelete: 'set null' }),
  action: text('action').notNull(),
  entity: text('entity').notNull(),
  entityId: integer('entity_id'),
  detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default({}),
  createdAt: createdAt(),
}, t => [index('audit_workshop_idx').on(t.workshopId, t.createdAt)])
