export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const workshop = useDb().query.workshops.findFirst({ where: (w, { eq }) => eq(w.id, actor.workshopId) }).sync()
  return { user: toSessionUser(actor), workshop: workshop && { id: workshop.id, name: workshop.name, currency: workshop.currency } }
})
