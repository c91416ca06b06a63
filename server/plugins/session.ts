// nuxt-auth-utils answers GET /api/_auth/session (what pages know about the signed-in person)
// from the cookie alone; hold it to the same rules as requireActor, so a signed-out or outdated
// cookie does not even show a name on the page.
export default defineNitroPlugin(() => {
  sessionHooks.hook('fetch', async (session, event) => {
    await assertSessionValid(event, session)
  })
  // Made before the first sign-in, so the first unknown address is not slower than the rest.
  void timingDummyHash()
})
