import type { H3Event } from 'h3'
import type { z } from 'zod'

// One error vocabulary for the API: every message says what was wrong and what to do.

export function notFound(what: string): never {
  throw createError({ statusCode: 404, message: `${what} not found. Check the link, or ask the workshop for a new one.` })
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
      const field = issue.path.join('.')
      return field ? `${field}: ${issue.message}` : issue.message
    })
    .join('; ')
}

function validated<T>(result: z.ZodSafeParseResult<T>, where: string): T {
  if (!result.success) {
    badRequest(`The ${where} is not valid — ${describeIssues(result.error)}. Correct it and try again.`, { issues: result.error.issues })
  }
  return result.data
}

export async function readBodyWith<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.infer<S>> {
  let body: unknown
  try {
    body = await readBody(event)
  }
  catch {
    badRequest('The request body is not valid JSON. Send a JSON object.')
  }
  return validated(schema.safeParse(body ?? {}), 'request')
}

export function readQueryWith<S extends z.ZodType>(event: H3Event, schema: S): z.infer<S> {
  return validated(schema.safeParse(getQuery(event)), 'query')
}

export function readParamsWith<S extends z.ZodType>(event: H3Event, schema: S): z.infer<S> {
  return validated(schema.safeParse(getRouterParams(event)), 'address')
}
