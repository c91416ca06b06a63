import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  name: z.string().trim().min(1, 'enter your name').max(120, 'keep your name under 120 characters').optional(),
  preferences: z.object({
    temperature: z.enum(['C', 'F']).optional(),
    pressure: z.enum(['kPa', 'bar', 'psi']).optional(),
    power: z.enum(['kW', 'hp', 'PS']).optional(),
  }).strict().optional(),
}).strict()

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const changes = await readBodyWith(event, body)
  if (changes.name === undefined && changes.preferences === undefined) badRequest('Nothing to change: send your name or your display units.')
  const row = useDb().update(tables.users).set({
    ...(changes.name !== undefined ? { name: changes.name } : {}),
    // Units not sent keep their saved value.
    ...(changes.preferences ? { preferences: { ...actor.preferences, ...changes.preferences } } : {}),
  }).where(eq(tables.users.id, actor.id)).returning().get()
  const user = toSessionUser(currentUserFromRow(row))
  await refreshSession(event, await getUserSession(event), user)
  return { user }
})
