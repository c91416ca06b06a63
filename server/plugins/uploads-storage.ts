// Mount the uploads storage at start-up (server/utils/uploads.ts), so a wrong driver or missing
// package stops the server with a message instead of failing the first upload.
export default defineNitroPlugin(() => {
  mountUploads().catch((error: Error) => {
    console.error(`[uploads] ${error.message}`)
    process.exit(1)
  })
})
