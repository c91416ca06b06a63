import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  name: z.string().trim().min(1, 'enter your name').max(100).optional(),
  preferences: z.object({
    temperature: z.enum(['C', 'F']).optional(),
    pressure: z.enum(['kPa', 'bar', 'psi']).optional(),
    power: z.enum(['kW', 'hp', 'PS']).optional(),
  }).strict().optional(),
}).strict()

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const changes = await readBodyWith(event, body)
  const row = useDb().update(tables.users).set({
    ...(changes.name ? { name: changes.name } : {}),
    ...(changes.preferences ? { preferences: { ...actor.preferences, ...changes.preferences } } : {}),
  }).where(eq(tables.users.id, actor.id)).returning().get()
  const user = toSessionUser(currentUserFromRow(row))
  await replaceUserSession(event, { user })
  return { user }
})
