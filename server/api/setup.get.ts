// Whether the first-run setup is open: only while no workshop exists. Afterwards it is gone (404),
// so the sign-in page stops offering it.
export default defineEventHandler(() => {
  if (!isSetupOpen(useDb())) throw createError({ statusCode: 404, message: SETUP_CLOSED_MESSAGE })
  return { open: true }
})
