import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  currentPassword: z.string().min(1, 'enter your current password'),
  newPassword: newPasswordField,
})

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { currentPassword, newPassword } = await readBodyWith(event, body)
  const db = useDb()
  const row = db.select().from(tables.users).where(eq(tables.users.id, actor.id)).get()!
  if (!await verifyPassword(row.passwordHash, currentPassword)) {
    badRequest('Your current password is not right. Type it again, or sign out and reset it by e-mail.')
  }
  const passwordHash = await hashPassword(newPassword)
  db.transaction((tx) => {
    tx.update(tables.users).set({ passwordHash }).where(eq(tables.users.id, actor.id)).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'changed-password', entity: 'user', entityId: actor.id })
  })
  return { ok: true }
})
