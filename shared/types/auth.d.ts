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
    loggedInAt?: number
  }
}

export {}
