// The four roles, declared once: this list feeds the database enum, the API schemas and the UI.
export const ROLES = ['owner', 'tuner', 'fabricator', 'driver'] as const
export type Role = typeof ROLES[number]

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Workshop owner',
  tuner: 'Tuner',
  fabricator: 'Fabricator',
  driver: 'Customer (driver)',
}

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value)
}
