// Turn a failed $fetch into the message the server wrote for a person.
export function apiErrorMessage(error: unknown): string {
  if (error && typeof error === 'object') {
    const data = (error as { data?: { message?: string } }).data
    if (data?.message) return data.message
    const status = (error as { statusCode?: number }).statusCode
    if (status === 429) return 'Too many attempts. Wait a few minutes and try again.'
  }
  return 'The server could not be reached. Check your connection and try again.'
}
