import { describe, expect, it } from 'vitest'
import { apiErrorMessage } from '../../../utils/apiError'

describe('apiErrorMessage', () => {
  it('passes on what the server wrote for a person', () => {
    expect(apiErrorMessage({ statusCode: 400, data: { message: 'Choose the car this log belongs to.' } })).toBe('Choose the car this log belongs to.')
    expect(apiErrorMessage({ statusCode: 502, data: { message: 'The payment service did not answer. Nothing was charged; try again in a minute.' } }))
      .toBe('The payment service did not answer. Nothing was charged; try again in a minute.')
  })

  it('says the server ran into a problem, not that it could not be reached, when it answered with a crash', () => {
    const crash = apiErrorMessage({ statusCode: 500, data: { message: 'Server Error' } })
    expect(crash).toMatch(/^The server ran into a problem/)
    expect(crash).not.toMatch(/could not be reached/)
    expect(apiErrorMessage({ statusCode: 503 })).toMatch(/^The server ran into a problem/)
  })

  it('says "could not be reached" only when no answer came back', () => {
    expect(apiErrorMessage(new TypeError('fetch failed'))).toBe('The server could not be reached. Check your connection and try again.')
    expect(apiErrorMessage(undefined)).toMatch(/could not be reached/)
  })

  it('asks a person to wait after too many attempts', () => {
    expect(apiErrorMessage({ statusCode: 429 })).toBe('Too many attempts. Wait a few minutes and try again.')
  })
})
