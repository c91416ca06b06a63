// What to tell a person when the server refuses an upload, by HTTP status.
export function uploadStatusMessage(status: number): string {
  if (status === 413) return 'The file is too large for the server. Trim the log to the stretch with the pulls and try again.'
  if (status === 415) return 'The server does not accept this kind of file. Export the log as CSV or text and try again.'
  if (status === 401) return 'Your session has ended. Sign in again and upload the log once more.'
  return `The server could not take the log (error ${status}). Try again in a moment.`
}
