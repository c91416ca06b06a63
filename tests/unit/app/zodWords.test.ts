import { z } from 'zod'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { plainIssueMessage } from '../../../server/utils/zod-words'

// The words a person reads when a schema check has no message of its own.
describe('plain words for unworded schema checks', () => {
  beforeAll(() => {
    z.config({ customError: plainIssueMessage })
  })
  afterAll(() => {
    z.config({ customError: undefined })
  })

  const schema = z.object({
    cylinders: z.number().int().min(1).max(16),
    name: z.string().min(1).max(5),
    fuel: z.enum(['diesel', 'petrol']),
    lines: z.array(z.number()).min(1).max(2),
    sent: z.boolean(),
  }).strict()
  const messages = (input: unknown) => schema.safeParse(input).error!.issues.map(issue => `${issue.path.join('.')}: ${issue.message}`)

  it('says what is missing or of the wrong kind, never the type names', () => {
    expect(messages({})).toEqual([
      'cylinders: this is missing', 'name: this is missing', 'fuel: this is missing', 'lines: this is missing', 'sent: this is missing',
    ])
    expect(messages({ cylinders: 'four', name: 3, fuel: 'steam', lines: 'a', sent: 'yes' })).toEqual([
      'cylinders: give a number', 'name: give it as text', 'fuel: choose one of the options offered', 'lines: give a list', 'sent: choose yes or no',
    ])
  })

  it('gives the bounds in words', () => {
    expect(messages({ cylinders: 4.5, name: '', fuel: 'diesel', lines: [], sent: true })).toEqual([
      'cylinders: give a whole number', 'name: this cannot be empty', 'lines: give at least one',
    ])
    expect(messages({ cylinders: 20, name: 'toolong', fuel: 'diesel', lines: [1, 2, 3], sent: true })).toEqual([
      'cylinders: give at most 16', 'name: use at most 5 characters', 'lines: give at most 2',
    ])
  })

  it('names the sender\'s own key that the route does not take, without calling it a key', () => {
    expect(messages({ cylinders: 4, name: 'a', fuel: 'diesel', lines: [1], sent: true, discount: 3 })).toEqual([
      ': the form sent something this page does not take ("discount")',
    ])
  })

  it('leaves a schema\'s own message alone', () => {
    expect(z.number().min(1, 'a car has at least one cylinder').safeParse(0).error!.issues[0]!.message).toBe('a car has at least one cylinder')
  })
})
