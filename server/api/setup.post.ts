import { z } from 'zod'

// First-run setup: creates the first workshop and its owner, and signs the owner in. Open to anyone
// only while the database has no workshop; from then on it answers 409 for good.
export default defineEventHandler(async (event) => {
  const db = useDb()
  if (!isSetupOpen(db)) throw createError({ statusCode: 409, message: SETUP_CLOSED_MESSAGE })
  // Checked here rather than by readBodyWith so that the message names what to fix in the form's
  // own words, without the field names (this is the first thing a new workshop reads).
  const parsed = firstRunFields.safeParse(await readBodyWith(event, z.record(z.string(), z.unknown())))
  if (!parsed.success) badRequest(`Check the form: ${parsed.error.issues.map(issue => issue.message).join('; ')}.`, { issues: parsed.error.issues })
  const { password, ...input } = parsed.data
  const passwordHash = await hashPassword(password)
  let created: ReturnType<typeof createFirstWorkshop>
  try {
    created = createFirstWorkshop(db, input, passwordHash)
  }
  catch (error) {
    // Another setup won the race while this one was hashing the password.
    if (error instanceof SetupClosedError) throw createError({ statusCode: 409, message: SETUP_CLOSED_MESSAGE })
    throw error
  }
  const user = toSessionUser(currentUserFromRow(created.owner))
  await startSession(event, user, created.owner.sessionVersion)
  setResponseStatus(event, 201)
  return { user, workshop: { id: created.workshop.id, name: created.workshop.name, currency: created.workshop.currency } }
})
