// How this server delivers e-mail, so the outbox page can say plainly when messages only reach
// the local mail sink (nobody outside receives them).
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  requireOutboxReader(actor)
  const settings = mailSettings()
  return { mode: settings.smtpUrl ? 'smtp' as const : 'sink' as const, from: settings.from }
})
