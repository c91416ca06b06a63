import { canManageMembers, canManagePrices, canSeeAllVehicles, canSeeAllQuotes, canViewCores, canViewOutbox, isCustomer } from './abilities'
import type { Role } from './roles'

export interface NavItem {
  to: string
  label: string
}

// The menu each role sees. Pages still check on the server; this only hides what a role cannot use.
export function navigationFor(role: Role): NavItem[] {
  const user = { role }
  const home: NavItem = { to: '/', label: isCustomer(user) ? 'My cars' : 'Overview' }
  const items: NavItem[] = [home]
  if (canSeeAllVehicles(user)) items.push({ to: '/vehicles', label: 'Cars' })
  // The fabricator reads the reports to size a core; the driver finds logs on their car's page.
  if (canSeeAllVehicles(user)) items.push({ to: '/logs', label: 'Logs' })
  // The tuner reads the catalogue (read-only) to recommend a core.
  if (canViewCores(user)) items.push({ to: '/cores', label: 'Core catalogue' })
  // The driver finds their quotes on their car's page.
  if (canSeeAllQuotes(user)) items.push({ to: '/quotes', label: 'Quotes' })
  if (canManageMembers(user)) items.push({ to: '/members', label: 'People' })
  if (canManagePrices(user)) items.push({ to: '/workshop', label: 'Workshop & prices' })
  // The fabricator follows the quote e-mails they send; the owner sees every e-mail.
  if (canViewOutbox(user)) items.push({ to: '/outbox', label: 'Outbox' })
  items.push({ to: '/account', label: 'My account' })
  return items
}
