// Turn a failed $fetch into the message the server wrote for a person. Only a request that got no
// answer at all is "could not be reached"; a server that answered with an error says so instead.
const GENERIC_SERVER_WORDS = /^(internal )?server error$/i

export const SERVER_PROBLEM = 'The server ran into a problem and could not finish this. Nothing you typed is lost: try again in a moment, and tell the workshop if it keeps happening.'
export const UNREACHABLE = 'The server could not be reached. Check your connection and try again.'

export function apiErrorMessage(error: unknown): string {
  if (error && typeof error === 'object') {
    const status = (error as { statusCode?: number, status?: number }).statusCode ?? (error as { status?: number }).status
    const data = (error as { data?: { message?: string } }).data
    // Nitro hides a crash's message behind "Server Error"; a route's own 5xx message (payment service, busy) is kept.
    if (data?.message && !GENERIC_SERVER_WORDS.test(data.message.trim())) return data.message
    if (status === 429) return 'Too many attempts. Wait a few minutes and try again.'
    if (status != null && status >= 500) return SERVER_PROBLEM
    if (status != null && status >= 400) return 'The server refused this request. Reload the page and try again.'
  }
  return UNREACHABLE
}
