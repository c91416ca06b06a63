import { and, eq, isNull } from 'drizzle-orm'
import { generateDemoLog } from '../analysis'
import type { Db } from './db'
import type { Role } from '#shared/utils/roles'
import type { Actor } from '#shared/utils/abilities'

// The demo scenario is invented: workshops, people and cars are our own.
// Registrations use a middle dot (`KRP·0421`), a form no country issues, so a demo plate is never a real car's.
export const DEMO_PASSWORD = 'densitas-demo'

interface DemoUser { email: string, name: string, role: Role }

const KESTREL_USERS: DemoUser[] = [
  { email: 'owner@kestrel.test', name: 'Maren Holt', role: 'owner' },
  { email: 'tuner@kestrel.test', name: 'Idris Calloway', role: 'tuner' },
  { email: 'fab@kestrel.test', name: 'Tove Brannigan', role: 'fabricator' },
  { email: 'driver@kestrel.test', name: 'Sam Okonjo', role: 'driver' },
  { email: 'driver2@kestrel.test', name: 'Petra Vasquez', role: 'driver' },
]

const HARBOURSIDE_USERS: DemoUser[] = [
  { email: 'owner@harbourside.test', name: 'Declan Moyle', role: 'owner' },
  { email: 'driver@harbourside.test', name: 'Ayla Fenwick', role: 'driver' },
]

export async function seedDemoIfEmpty(db: Db) {
  if (countRows(tables.workshops) > 0) return false
  const passwordHash = await hashPassword(DEMO_PASSWORD)

  const seeded = db.transaction((tx) => {
    const kestrel = tx.insert(tables.workshops).values({ name: 'Kestrel Road Performance', slug: 'kestrel-road', currency: 'EUR', labourRateCents: 8500, depositPercent: 30, quoteTerms: 'Work is booked in once the deposit is paid. The balance is due when the car is collected. Parts ordered for this job are not returnable.' }).returning().get()
    const harbourside = tx.insert(tables.workshops).values({ name: 'Harbourside Fabrication', slug: 'harbourside', currency: 'GBP', labourRateCents: 7200, depositPercent: 25 }).returning().get()

    const addUsers = (workshopId: number, list: DemoUser[]) =>
      Object.fromEntries(list.map(u => [u.email, tx.insert(tables.users).values({ ...u, workshopId, passwordHash }).returning().get()]))
    const k = addUsers(kestrel.id, KESTREL_USERS)
    const h = addUsers(harbourside.id, HARBOURSIDE_USERS)

    // An invented catalogue: every field filled, names of our own. Prices in minor units.
    const stock = tx.insert(tables.cores).values({ workshopId: kestrel.id, name: 'Factory side-mount core (small)', kind: 'stock', construction: 'tube-and-fin', faceWidthMm: 300, faceHeightMm: 180, depthMm: 60, finDensity: 14, finDensityUnit: 'per-inch', inletDiameterMm: 50, outletDiameterMm: 50, endTankLayout: 'same-side', weightKg: 2.1, uaWPerK: 190, costCents: 0, priceCents: 0, notes: 'As fitted from the factory to the demo hatchback. Kept for comparison; not sold.' }).returning().get()
    const frontMount = tx.insert(tables.cores).values({ workshopId: kestrel.id, name: 'Kestrel bar-and-plate front-mount 600', kind: 'front-mount', construction: 'bar-and-plate', faceWidthMm: 600, faceHeightMm: 300, depthMm: 76, finDensity: 48, finDensityUnit: 'per-10cm', inletDiameterMm: 63, outletDiameterMm: 63, endTankLayout: 'opposite-sides', weightKg: 7.4, uaWPerK: 420, costCents: 38_500, priceCents: 64_000, notes: 'Our usual uprate for 2.0 L hatchbacks.' }).returning().get()
    tx.insert(tables.cores).values([
      { workshopId: kestrel.id, name: 'Compact front-mount 550', kind: 'front-mount', construction: 'tube-and-fin', faceWidthMm: 550, faceHeightMm: 230, depthMm: 65, finDensity: 16, finDensityUnit: 'per-inch', inletDiameterMm: 57, outletDiameterMm: 57, endTankLayout: 'opposite-sides', weightKg: 4.6, uaWPerK: 300, costCents: 27_000, priceCents: 48_000, notes: 'Fits behind the bumper without cutting on most small hatchbacks.' },
      { workshopId: kestrel.id, name: 'Kestrel tube-and-fin front-mount 650', kind: 'front-mount', construction: 'tube-and-fin', faceWidthMm: 650, faceHeightMm: 280, depthMm: 70, finDensity: 15, finDensityUnit: 'per-inch', inletDiameterMm: 63, outletDiameterMm: 63, endTankLayout: 'same-side', weightKg: 5.9, uaWPerK: 380, costCents: 33_000, priceCents: 56_500, notes: 'Lighter than the bar-and-plate cores; both pipes on the driver\'s side.' },
      { workshopId: kestrel.id, name: 'Kestrel bar-and-plate front-mount 700 deep', kind: 'front-mount', construction: 'bar-and-plate', faceWidthMm: 700, faceHeightMm: 300, depthMm: 100, finDensity: 52, finDensityUnit: 'per-10cm', inletDiameterMm: 70, outletDiameterMm: 70, endTankLayout: 'opposite-sides', weightKg: 10.8, uaWPerK: 600, costCents: 52_000, priceCents: 86_000, notes: 'For tuned cars on track days; needs the bumper beam trimmed on most hatchbacks.' },
      { workshopId: harbourside.id, name: 'Harbourside tube-and-fin front-mount 700', kind: 'front-mount', faceWidthMm: 700, faceHeightMm: 300, depthMm: 80, priceCents: 72_000, notes: '' },
    ]).run()

    const hatchback = tx.insert(tables.vehicles).values({ workshopId: kestrel.id, ownerId: k['driver@kestrel.test']!.id, description: '2.0 L four-cylinder turbo-diesel hatchback', registration: 'KRP·0421', displacementL: 2.0, cylinders: 4, fuel: 'diesel', ratedPowerKw: 110, fittedCoreId: stock.id, notes: 'Customer reports power fading on the third hard pull up the hill.' }).returning().get()
    tx.insert(tables.vehicles).values([
      { workshopId: kestrel.id, ownerId: k['driver2@kestrel.test']!.id, description: '1.8 L four-cylinder turbo-petrol estate', registration: 'KRP·0419', displacementL: 1.8, cylinders: 4, fuel: 'petrol', ratedPowerKw: 132, notes: '' },
      { workshopId: harbourside.id, ownerId: h['driver@harbourside.test']!.id, description: '3.0 L six-cylinder turbo-diesel pickup', registration: 'HBF·0420', displacementL: 3.0, cylinders: 6, fuel: 'diesel', ratedPowerKw: 190, notes: 'Tows a boat trailer up the slipway.' },
    ]).run()
    return { kestrel, tuner: k['tuner@kestrel.test']!, fabricator: k['fab@kestrel.test']!, hatchback, stock, frontMount }
  })

  // Two invented logs of the hatchback, stored exactly as an upload would store them: a mild
  // spring day with the small factory core soaking over six pulls, and the same car on a hot
  // summer day after the front-mount. Each log records the core fitted when it was made.
  const actor = { id: seeded.tuner.id, role: seeded.tuner.role, workshopId: seeded.kestrel.id }
  const logs = [
    { scenario: 'stock-core-hot-day' as const, ambientC: 14, fileName: 'demo-stock-core-mild-day.csv', coreId: seeded.stock.id, recordedOn: '2026-04-18', notes: 'Six pulls on the test track, factory core, a mild spring day. Customer says the third pull already felt flat.' },
    { scenario: 'front-mount-after' as const, ambientC: 32, fileName: 'demo-front-mount-after.csv', coreId: seeded.frontMount.id, recordedOn: '2026-08-02', notes: 'Same track and route after fitting the bar-and-plate front-mount, on a hot summer afternoon.' },
  ]
  const stored: Record<'before' | 'after', number[]> = { before: [], after: [] }
  for (const entry of logs) {
    db.update(tables.vehicles).set({ fittedCoreId: entry.coreId }).where(eq(tables.vehicles.id, seeded.hatchback.id)).run()
    const demo = generateDemoLog(entry.scenario, { ambientC: entry.ambientC })
    const { log } = await storeNewLog({
      actor,
      vehicle: db.select().from(tables.vehicles).where(eq(tables.vehicles.id, seeded.hatchback.id)).get()!,
      file: { bytes: new TextEncoder().encode(demo.csv) },
      originalName: entry.fileName,
      conditions: {},
      notes: entry.notes,
      recordedOn: entry.recordedOn,
    })
    stored[entry.coreId === seeded.stock.id ? 'before' : 'after'].push(log.id)
  }
  await seedDemoComparison(db, actor, seeded.hatchback.id, stored)
  // The fabricator sized the current front-mounts against the factory-core log (35 °C design day)
  // and quoted the 600 from that sizing, as the sizing page and the quote form would.
  const fabricator = { id: seeded.fabricator.id, role: seeded.fabricator.role, workshopId: seeded.kestrel.id }
  const frontMounts = db.select({ id: tables.cores.id }).from(tables.cores)
    .where(and(eq(tables.cores.workshopId, seeded.kestrel.id), eq(tables.cores.kind, 'front-mount'), isNull(tables.cores.retiredAt))).all()
  const sizing = await runSizing(fabricator, { vehicleId: seeded.hatchback.id, logId: stored.before[0]!, candidateCoreIds: frontMounts.map(core => core.id), design: { ambientC: 35 } })
  await seedDemoQuote(db, { workshopId: seeded.kestrel.id, fabricatorId: seeded.fabricator.id, vehicleId: seeded.hatchback.id, coreId: seeded.frontMount.id, sizingId: sizing.id })
  return true
}

// The hatchback's before-and-after: a stored comparison of the two logs at 25 °C, and one dyno
// run a side (invented figures: the after run was on a hotter, lower-pressure day).
async function seedDemoComparison(db: Db, actor: Actor, vehicleId: number, sides: Record<'before' | 'after', number[]>) {
  const vehicle = db.select().from(tables.vehicles).where(eq(tables.vehicles.id, vehicleId)).get()!
  const result = await computeComparison(actor, vehicle, sides, 25)
  db.transaction((tx) => {
    const comparison = tx.insert(tables.comparisons).values({
      workshopId: actor.workshopId,
      vehicleId,
      title: 'Factory core against the front-mount',
      referenceAmbientC: 25,
      result: result as unknown as Record<string, unknown>,
      computedAt: new Date(),
      createdById: actor.id,
    }).returning().get()
    tx.insert(tables.comparisonLogs).values(result.logs.map(l => ({ comparisonId: comparison.id, logId: l.id, side: l.side }))).run()
    const logs = tx.select({ id: tables.logs.id, coreId: tables.logs.coreId }).from(tables.logs).where(eq(tables.logs.vehicleId, vehicleId)).all()
    const coreOf = (side: 'before' | 'after') => logs.find(l => l.id === sides[side][0])?.coreId ?? null
    tx.insert(tables.dynoRuns).values([
      { workshopId: actor.workshopId, vehicleId, label: 'Before: factory core', side: 'before', coreId: coreOf('before'), powerKw: 104.5, torqueNm: 318, rpm: 4000, ambientTempC: 16, baroKpa: 101.2, humidityPct: 55, runOn: '2026-04-18', createdById: actor.id },
      { workshopId: actor.workshopId, vehicleId, label: 'After: front-mount', side: 'after', coreId: coreOf('after'), powerKw: 105, torqueNm: 322, rpm: 4000, ambientTempC: 33, baroKpa: 99.8, humidityPct: 40, runOn: '2026-08-02', createdById: actor.id },
    ]).run()
  })
}
