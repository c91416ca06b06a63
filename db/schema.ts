import { sql } from 'drizzle-orm'
import { index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core'
import { CORE_CONSTRUCTIONS, CORE_KINDS, END_TANK_LAYOUTS, FIN_DENSITY_UNITS } from '../shared/utils/cores'
import { ROLES } from '../shared/utils/roles'

// Every feature table carries workshop_id so a query can always be scoped with one WHERE.
// Timestamps are unix epoch milliseconds (integer, mode 'timestamp_ms').

const createdAt = () => integer('created_at', { mode: 'timestamp_ms' }).notNull().default(sql`(unixepoch('subsec') * 1000)`)

export const FUELS = ['diesel', 'petrol'] as const
export const LOG_STATUSES = ['analysed', 'failed'] as const
export const QUOTE_STATUSES = ['draft', 'sent', 'accepted', 'deposit_paid', 'in_progress', 'completed', 'declined', 'expired', 'cancelled'] as const
export const PAYMENT_STATUSES = ['pending', 'succeeded', 'failed', 'refunded'] as const
export const OUTBOX_STATUSES = ['queued', 'sent', 'failed'] as const
export { CORE_CONSTRUCTIONS, END_TANK_LAYOUTS, FIN_DENSITY_UNITS } from '../shared/utils/cores'
export const COMPARISON_SIDES = ['before', 'after'] as const
export const CORRECTION_STANDARDS = ['sae-j1349-2004', 'sae-j1349-1990', 'iso-1585', 'din-70020'] as const

export const workshops = sqliteTable('workshops', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull(),
  slug: text('slug').notNull().unique(),
  currency: text('currency').notNull().default('EUR'),
  // Prices the owner keeps: labour per hour and the deposit share of a quote.
  labourRateCents: integer('labour_rate_cents').notNull().default(9000),
  depositPercent: integer('deposit_percent').notNull().default(30),
  // Quote defaults the owner keeps: tax rate (%), days a quote stays valid, and the terms printed on it.
  taxRatePct: real('tax_rate_pct').notNull().default(20),
  quoteValidityDays: integer('quote_validity_days').notNull().default(30),
  quoteTerms: text('quote_terms').notNull().default(''),
  // The dyno correction standard the workshop quotes by default.
  correctionStandard: text('correction_standard', { enum: CORRECTION_STANDARDS }).notNull().default('sae-j1349-2004'),
  createdAt: createdAt(),
})

export const users = sqliteTable('users', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash').notNull(),
  role: text('role', { enum: ROLES }).notNull(),
  // Display units only; results stay SI. { temperature, pressure, power }, each one of DISPLAY_UNITS (shared/quantities/display.ts).
  preferences: text('preferences', { mode: 'json' }).$type<Record<string, string>>().notNull().default({}),
  // Bumped on sign-out everywhere, password change or reset, and removal: every older session ends.
  sessionVersion: integer('session_version').notNull().default(0),
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

// Sessions signed out on one device: the sealed cookie cannot be recalled, so its id is refused
// until the cookie would have expired anyway (then the row may go).
export const revokedSessions = sqliteTable('revoked_sessions', {
  sessionId: text('session_id').primaryKey(),
  userId: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
}, t => [index('revoked_sessions_expires_idx').on(t.expiresAt)])

export const cores = sqliteTable('cores', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  kind: text('kind', { enum: CORE_KINDS }).notNull(),
  faceWidthMm: integer('face_width_mm').notNull(),
  faceHeightMm: integer('face_height_mm').notNull(),
  depthMm: integer('depth_mm').notNull(),
  construction: text('construction', { enum: CORE_CONSTRUCTIONS }),
  finDensity: real('fin_density'),
  finDensityUnit: text('fin_density_unit', { enum: FIN_DENSITY_UNITS }),
  inletDiameterMm: integer('inlet_diameter_mm'),
  outletDiameterMm: integer('outlet_diameter_mm'),
  endTankLayout: text('end_tank_layout', { enum: END_TANK_LAYOUTS }),
  weightKg: real('weight_kg'),
  // Heat conductance from a measured log or the maker's data, if known (W/K).
  uaWPerK: real('ua_w_per_k'),
  // What the workshop pays for the core, and what it sells it for (priceCents), in minor units.
  costCents: integer('cost_cents'),
  priceCents: integer('price_cents'),
  notes: text('notes').notNull().default(''),
  // A retired core stays on old logs, quotes and evidence, but is not offered for new work.
  retiredAt: integer('retired_at', { mode: 'timestamp_ms' }),
  createdAt: createdAt(),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' }),
}, t => [index('cores_workshop_idx').on(t.workshopId), uniqueIndex('cores_name_uq').on(t.workshopId, t.name)])

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
  // The core fitted when the log was made (not the car's current core: fitting another one later
  // does not rewrite older logs).
  coreId: integer('core_id').references(() => cores.id, { onDelete: 'set null' }),
  // When the uploaded file held several joined drives: which one this log is (0-based); null = the whole file.
  driveIndex: integer('drive_index'),
  createdAt: createdAt(),
}, t => [index('logs_workshop_idx').on(t.workshopId), index('logs_vehicle_idx').on(t.vehicleId), index('logs_core_idx').on(t.coreId)])

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
  title: text('title').notNull().default(''),
  referenceAmbientC: real('reference_ambient_c').notNull().default(25),
  result: text('result', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  recommendation: text('recommendation').notNull().default(''),
  // Set when a log's pull edits changed after the result was computed.
  staleAt: integer('stale_at', { mode: 'timestamp_ms' }),
  computedAt: integer('computed_at', { mode: 'timestamp_ms' }).notNull(),
  createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
}, t => [index('comparisons_workshop_idx').on(t.workshopId), index('comparisons_vehicle_idx').on(t.vehicleId)])

// The logs on each side of a comparison.
export const comparisonLogs = sqliteTable('comparison_logs', {
  comparisonId: integer('comparison_id').notNull().references(() => comparisons.id, { onDelete: 'cascade' }),
  logId: integer('log_id').notNull().references(() => logs.id, { onDelete: 'cascade' }),
  side: text('side', { enum: COMPARISON_SIDES }).notNull(),
}, t => [primaryKey({ columns: [t.comparisonId, t.logId] }), index('comparison_logs_log_idx').on(t.logId)])

// A power figure measured on a dyno, with the air it was measured in.
export const dynoRuns = sqliteTable('dyno_runs', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  vehicleId: integer('vehicle_id').notNull().references(() => vehicles.id, { onDelete: 'cascade' }),
  label: text('label').notNull(),
  side: text('side', { enum: COMPARISON_SIDES }),
  coreId: integer('core_id').references(() => cores.id, { onDelete: 'set null' }),
  powerKw: real('power_kw').notNull(),
  torqueNm: real('torque_nm'),
  rpm: real('rpm'),
  ambientTempC: real('ambient_temp_c').notNull(),
  baroKpa: real('baro_kpa').notNull(),
  humidityPct: real('humidity_pct'),
  runOn: text('run_on'),
  createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
}, t => [index('dyno_runs_workshop_idx').on(t.workshopId), index('dyno_runs_vehicle_idx').on(t.vehicleId)])

// A front-mount sizing: the log it was calibrated on, the design conditions and the ranked candidates.
export const sizings = sqliteTable('sizings', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  vehicleId: integer('vehicle_id').notNull().references(() => vehicles.id, { onDelete: 'cascade' }),
  logId: integer('log_id').references(() => logs.id, { onDelete: 'set null' }),
  design: text('design', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  result: text('result', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
}, t => [index('sizings_workshop_idx').on(t.workshopId), index('sizings_vehicle_idx').on(t.vehicleId)])

export const quotes = sqliteTable('quotes', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  // Per workshop and year, e.g. Q-2026-0001; taken from quote_numbers, never reused.
  number: text('number').notNull(),
  vehicleId: integer('vehicle_id').notNull().references(() => vehicles.id, { onDelete: 'cascade' }),
  customerId: integer('customer_id').notNull().references(() => users.id, { onDelete: 'restrict' }),
  coreId: integer('core_id').references(() => cores.id, { onDelete: 'set null' }),
  sizingId: integer('sizing_id').references(() => sizings.id, { onDelete: 'set null' }),
  status: text('status', { enum: QUOTE_STATUSES }).notNull().default('draft'),
  revision: integer('revision').notNull().default(1),
  currency: text('currency').notNull(),
  subtotalCents: integer('subtotal_cents').notNull().default(0),
  taxRatePct: real('tax_rate_pct').notNull().default(0),
  taxCents: integer('tax_cents').notNull().default(0),
  totalCents: integer('total_cents').notNull().default(0),
  depositPct: real('deposit_pct').notNull().default(0),
  depositCents: integer('deposit_cents').notNull().default(0),
  validUntil: text('valid_until'),
  terms: text('terms').notNull().default(''),
  sizing: text('sizing', { mode: 'json' }).$type<Record<string, unknown>>(),
  notes: text('notes').notNull().default(''),
  createdById: integer('created_by_id').references(() => users.id, { onDelete: 'set null' }),
  sentAt: integer('sent_at', { mode: 'timestamp_ms' }),
  acceptedAt: integer('accepted_at', { mode: 'timestamp_ms' }),
  declinedAt: integer('declined_at', { mode: 'timestamp_ms' }),
  paidAt: integer('paid_at', { mode: 'timestamp_ms' }),
  createdAt: createdAt(),
  updatedAt: integer('updated_at', { mode: 'timestamp_ms' }),
}, t => [index('quotes_workshop_idx').on(t.workshopId), index('quotes_customer_idx').on(t.customerId), uniqueIndex('quotes_number_uq').on(t.workshopId, t.number)])

// The last quote number handed out per workshop and year.
export const quoteNumbers = sqliteTable('quote_numbers', {
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  year: integer('year').notNull(),
  last: integer('last').notNull(),
}, t => [primaryKey({ columns: [t.workshopId, t.year] })])

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
}, t => [index('payments_quote_idx').on(t.quoteId)])

// Payment-provider events already handled: a replayed event changes nothing.
export const paymentEvents = sqliteTable('payment_events', {
  id: text('id').primaryKey(),
  type: text('type').notNull(),
  receivedAt: createdAt(),
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
  // [{ filename, contentType, size, contentBase64 }]: small attachments such as a quote PDF.
  attachments: text('attachments', { mode: 'json' }).$type<Array<Record<string, unknown>>>().notNull().default([]),
  attempts: integer('attempts').notNull().default(0),
  nextAttemptAt: integer('next_attempt_at', { mode: 'timestamp_ms' }),
  messageId: text('message_id'),
  error: text('error'),
  sentAt: integer('sent_at', { mode: 'timestamp_ms' }),
  createdAt: createdAt(),
}, t => [index('outbox_workshop_idx').on(t.workshopId), index('outbox_status_idx').on(t.status)])

export const shareLinks = sqliteTable('share_links', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  workshopId: integer('workshop_id').notNull().references(() => workshops.id, { onDelete: 'cascade' }),
  // Exactly one of these: the report of a log, or a comparison.
  logId: integer('log_id').references(() => logs.id, { onDelete: 'cascade' }),
  comparisonId: integer('comparison_id').references(() => comparisons.id, { onDelete: 'cascade' }),
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
