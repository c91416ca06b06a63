import { z } from 'zod'

// Route parameters: ids are positive whole numbers; anything else is a 400 that says the link is wrong.
const LINK_NUMBER = 'the link should end in a whole number'
export const idParams = z.object({ id: z.coerce.number({ message: LINK_NUMBER }).int(LINK_NUMBER).positive(LINK_NUMBER) })

export const emailField = z.string().trim().toLowerCase().max(254, 'an e-mail address has at most 254 characters').pipe(z.email({ message: 'enter an e-mail address like name@example.com' }))

// Long enough to resist guessing; no composition rules (NIST SP 800-63B advice).
export const newPasswordField = z.string().min(10, 'use at least 10 characters').max(200, 'use at most 200 characters')
