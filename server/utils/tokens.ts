import { createHash, randomBytes } from 'node:crypto'

// Links carry a random token; the database keeps only its hash.
export function newToken() {
  const token = randomBytes(32).toString('base64url')
  return { token, tokenHash: hashToken(token) }
}

export function hashToken(token: string) {
  return createHash('sha256').update(token).digest('hex')
}

export function appLink(path: string) {
  const base = process.env.APP_URL || useRuntimeConfig().public.appUrl
  return new URL(path, base).toString()
}
