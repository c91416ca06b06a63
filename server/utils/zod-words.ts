import type { z } from 'zod'

// Plain words for the checks a schema did not word itself (a missing field, a number sent as text,
// a key the route does not take). Zod's own defaults ("Invalid input: expected number, received
// undefined") name types and keys, not what the person should do. Set once at start-up
// (server/plugins/zod-words.ts); a message written in a schema always wins. The field's name is
// put in front by describeIssues (server/utils/http.ts).
export function plainIssueMessage(issue: z.core.$ZodRawIssue): string | undefined {
  switch (issue.code) {
    case 'invalid_type':
      if (issue.input === undefined) return 'this is missing'
      switch (issue.expected) {
        case 'int': return 'give a whole number'
        case 'number': return 'give a number'
        case 'string': return 'give it as text'
        case 'boolean': return 'choose yes or no'
        case 'array': return 'give a list'
        case 'date': return 'give a date like 2026-07-14'
        default: return 'this is not in a form Densitas can read'
      }
    case 'too_small': {
      const min = Number(issue.minimum)
      if (issue.origin === 'string') return min <= 1 ? 'this cannot be empty' : `use at least ${min} characters`
      if (issue.origin === 'array') return min <= 1 ? 'give at least one' : `give at least ${min}`
      return issue.inclusive === false ? `give more than ${min}` : `give at least ${min}`
    }
    case 'too_big': {
      const max = Number(issue.maximum)
      if (issue.origin === 'string') return `use at most ${max} characters`
      if (issue.origin === 'array') return `give at most ${max}`
      return issue.inclusive === false ? `give less than ${max}` : `give at most ${max}`
    }
    case 'invalid_value':
      return issue.input === undefined ? 'this is missing' : 'choose one of the options offered'
    case 'invalid_format':
      return issue.format === 'email' ? 'enter an e-mail address like name@example.com' : 'this is not in a form Densitas can read'
    case 'unrecognized_keys':
      // The keys are the sender's own, not ours: naming them says what to leave out.
      return `the form sent something this page does not take (${issue.keys.map(key => `"${key.slice(0, 40)}"`).join(', ')})`
    case 'not_multiple_of':
      return `give a multiple of ${String(issue.divisor)}`
    default:
      return undefined
  }
}
