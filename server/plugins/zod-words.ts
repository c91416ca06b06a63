import { z } from 'zod'

// Plain words for every unworded schema check, before the first request (server/utils/zod-words.ts).
export default defineNitroPlugin(() => {
  z.config({ customError: plainIssueMessage })
})
