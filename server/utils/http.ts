import type { H3Event } from 'h3'
import { isCustomer, type HasRole } from '#shared/utils/abilities'
import { fieldPathLabel } from '#shared/utils/fieldLabels'
import type { z } from 'zod'

// One error vocabulary for the API: every message says what was wrong and what to do.

/**
 * Worded for who reads it: a customer can only ask the workshop; staff are the workshop, so they
 * hear why a record they once saw may be gone (deleted, or in another workshop's Densitas).
 */
export function notFound(what: string, reader?: HasRole): never {
  const hint = reader && !isCustomer(reader)
    ? 'It may have been deleted, or it belongs to another workshop. Open it again from the list.'
    : 'Check the link, or ask the workshop for a new one.'
  throw createError({ statusCode: 404, message: `${what} not found. ${hint}` })
}

export function forbidden(message: string): never {
  throw createError({ statusCode: 403, message })
}

export function badRequest(message: string, data?: unknown): never {
  throw createError({ statusCode: 400, message, data })
}

export function describeIssues(error: z.ZodError): string {
  return error.issues
    .map((issue) => {
      // Plain field names, never the request's own keys (`vehicleId`): the message is read by a person.
      // A message that already names its field ("enter the engine size in litres") needs no prefix.
      const field = fieldPathLabel(issue.path)
      if (!field || issue.message.toLowerCase().includes(field.toLowerCase())) return issue.message
      return `${field.charAt(0).toUpperCase()}${field.slice(1)}: ${issue.message}`
    })
    .join('; ')
}

// What a person calls each part of a request: they filled in a form, chose values (the query) or
// opened a link (the route's parameters).
const WHERE_WORDS = {
  request: { what: 'the form', fix: 'Correct it and try again.' },
  query: { what: 'the values you asked for', fix: 'Correct them and try again.' },
  address: { what: 'the link', fix: 'Open the page again from the menu.' },
} as const

function validated<T>(result: z.ZodSafeParseResult<T>, where: keyof typeof WHERE_WORDS): T {
  if (!result.success) {
    const words = WHERE_WORDS[where]
    badRequest(`Please check ${words.what} — ${describeIssues(result.error)}. ${words.fix}`, { issues: result.error.issues })
  }
  return result.data
}

export async function readBodyWith<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.infer<S>> {
  let body: unknown
  try {
    body = await readBody(event)
  }
  catch {
    badRequest('The form did not arrive in a shape the server can read. Reload the page and try again.')
  }
  return validated(schema.safeParse(body ?? {}), 'request')
}

export function readQueryWith<S extends z.ZodType>(event: H3Event, schema: S): z.infer<S> {
  return validated(schema.safeParse(getQuery(event)), 'query')
}

export function readParamsWith<S extends z.ZodType>(event: H3Event, schema: S): z.infer<S> {
  return validated(schema.safeParse(getRouterParams(event)), 'address')
}
