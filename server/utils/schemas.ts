import { z } from 'zod'

// Route parameters: ids are positive integers; anything else is a 404 (a malformed id names no row).
export const idParams = z.object({ id: z.coerce.number().int().positive() })

export const emailField = z.string().trim().toLowerCase().max(254, 'an e-mail address has at most 254 characters').pipe(z.email({ message: 'enter an e-mail address like name@example.com' }))

// Long enough to resist guessing; no composition rules (NIST SP 800-63B advice).
export const newPasswordField = z.string().min(10, 'use at least 10 characters').max(200, 'use at most 200 characters')
