// The local checkout stand-in starts on first use (see server/utils/payments.ts); close it with the server.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('close', () => stopLocalCheckout())
})
