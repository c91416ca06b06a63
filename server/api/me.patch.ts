import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { DISPLAY_QUANTITY_LABELS, displayChoicesText, displayUnitIds, type DisplayQuantity } from '#shared/quantities/display'

// The display units the unit catalogue offers, and only those.
const displayUnit = <Q extends DisplayQuantity>(quantity: Q) =>
  z.enum(displayUnitIds(quantity), { message: `the ${DISPLAY_QUANTITY_LABELS[quantity].toLowerCase()} unit must be ${displayChoicesText(quantity)}` }).optional()

const body = z.object({
  name: z.string().trim().min(1, 'enter your name').max(120, 'keep your name under 120 characters').optional(),
  preferences: z.object({
    temperature: displayUnit('temperature'),
    pressure: displayUnit('pressure'),
    power: displayUnit('power'),
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
