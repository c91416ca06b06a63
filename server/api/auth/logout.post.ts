import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({ everywhere: z.boolean({ message: 'everywhere is true or false' }).optional() }).strict()

// Sign out this device (its cookie is refused from now on, even if someone kept a copy), or every
// device at once (every cookie issued so far carries an older session version).
export default defineEventHandler(async (event) => {
  const { everywhere } = await readBodyWith(event, body)
  const session = await getUserSession(event)
  const db = useDb()
  // A removed account has nothing left to end; only its cookie is cleared.
  const user = session.user && db.select().from(tables.users).where(eq(tables.users.id, session.user.id)).get()
  if (user) {
    db.transaction((tx) => {
      revokeSession(tx, session)
      if (everywhere) endAllSessions(tx, user.id)
      recordAudit(tx, { workshopId: user.workshopId, userId: user.id, action: everywhere ? 'signed-out-everywhere' : 'signed-out', entity: 'user', entityId: user.id })
    })
  }
  await clearUserSession(event)
  return { ok: true }
})
