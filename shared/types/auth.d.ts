import type { Role } from '../utils/roles'

declare module '#auth-utils' {
  interface User {
    id: number
    email: string
    name: string
    role: Role
    workshopId: number
    preferences: Record<string, string>
  }
  interface UserSession {
    // When this device signed in (epoch ms): the maximum age counts from here.
    loggedInAt?: number
    // This sign-in's own id, refused once it signs out (revoked_sessions).
    sid?: string
    // users.sessionVersion when the cookie was issued; an older one has ended.
    version?: number
  }
}

export {}
