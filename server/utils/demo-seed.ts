import { eq } from 'drizzle-orm'
import { generateDemoLog } from '../analysis'
import type { Db } from './db'
import type { Role } from '#shared/utils/roles'

// The demo scenario is invented: workshops, people and cars are our own.
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
    const kestrel = tx.insert(tables.workshops).values({ name: 'Kestrel Road Performance', slug: 'kestrel-road', currency: 'EUR', labourRateCents: 8500, depositPercent: 30 }).returning().get()
    const harbourside = tx.insert(tables.workshops).values({ name: 'Harbourside Fabrication', slug: 'harbourside', currency: 'GBP', labourRateCents: 7200, depositPercent: 25 }).returning().get()

    const addUsers = (workshopId: number, list: DemoUser[]) =>
      Object.fromEntries(list.map(u => [u.email, tx.insert(tables.users).values({ ...u, workshopId, passwordHash }).returning().get()]))
    const k = addUsers(kestrel.id, KESTREL_USERS)
    const h = addUsers(harbourside.id, HARBOURSIDE_USERS)

    const stock = tx.insert(tables.cores).values({ workshopId: kestrel.id, name: 'Factory side-mount core (small)', kind: 'stock', faceWidthMm: 300, faceHeightMm: 180, depthMm: 60, notes: 'As fitted from the factory to the demo hatchback.' }).returning().get()
    const frontMount = tx.insert(tables.cores).values({ workshopId: kestrel.id, name: 'Kestrel bar-and-plate front-mount 600', kind: 'front-mount', faceWidthMm: 600, faceHeightMm: 300, depthMm: 76, priceCents: 64_000, notes: 'Our usual uprate for 2.0 L hatchbacks.' }).returning().get()
    tx.insert(tables.cores).values([
      { workshopId: kestrel.id, name: 'Compact front-mount 550', kind: 'front-mount', faceWidthMm: 550, faceHeightMm: 230, depthMm: 65, priceCents: 48_000, notes: 'Fits behind the bumper without cutting on most small hatchbacks.' },
      { workshopId: harbourside.id, name: 'Harbourside tube-and-fin front-mount 700', kind: 'front-mount', faceWidthMm: 700, faceHeightMm: 300, depthMm: 80, priceCents: 72_000, notes: '' },
    ]).run()

    const hatchback = tx.insert(tables.vehicles).values({ workshopId: kestrel.id, ownerId: k['driver@kestrel.test']!.id, description: '2.0 L four-cylinder turbo-diesel hatchback', registration: 'KR 21 DSL', displacementL: 2.0, cylinders: 4, fuel: 'diesel', ratedPowerKw: 110, fittedCoreId: stock.id, notes: 'Customer reports power fading on the third hard run up the hill.' }).returning().get()
    tx.insert(tables.vehicles).values([
      { workshopId: kestrel.id, ownerId: k['driver2@kestrel.test']!.id, description: '1.8 L four-cylinder turbo-petrol estate', registration: 'KR 19 PTL', displacementL: 1.8, cylinders: 4, fuel: 'petrol', ratedPowerKw: 132, notes: '' },
      { workshopId: harbourside.id, ownerId: h['driver@harbourside.test']!.id, description: '3.0 L six-cylinder turbo-diesel pickup', registration: 'HB 20 TOW', displacementL: 3.0, cylinders: 6, fuel: 'diesel', ratedPowerKw: 190, notes: 'Tows a boat trailer up the slipway.' },
    ]).run()
    return { kestrel, tuner: k['tuner@kestrel.test']!, hatchback, frontMount }
  })

  // Two invented logs of the hatchback, stored exactly as an upload would store them: a hot day
  // with the small factory core soaking over six pulls, and the same car after the front-mount.
  const actor = { id: seeded.tuner.id, role: seeded.tuner.role, workshopId: seeded.kestrel.id }
  const logs = [
    { scenario: 'stock-core-hot-day' as const, recordedOn: '2026-07-14', notes: 'Six pulls on the test track, factory core. Customer says the third pull already felt flat.' },
    { scenario: 'front-mount-after' as const, recordedOn: '2026-08-02', notes: 'Same track and route after fitting the bar-and-plate front-mount.' },
  ]
  for (const entry of logs) {
    const demo = generateDemoLog(entry.scenario)
    await storeNewLog({
      actor,
      vehicle: db.select().from(tables.vehicles).where(eq(tables.vehicles.id, seeded.hatchback.id)).get()!,
      file: { bytes: new TextEncoder().encode(demo.csv) },
      originalName: demo.fileName,
      conditions: {},
      notes: entry.notes,
      recordedOn: entry.recordedOn,
    })
  }
  db.update(tables.vehicles).set({ fittedCoreId: seeded.frontMount.id }).where(eq(tables.vehicles.id, seeded.hatchback.id)).run()
  return true
}
