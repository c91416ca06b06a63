import { describe, expect, it } from 'vitest'
import { ref } from 'vue'

describe('throwOnLoadError', () => {
  it('lets a page go on when its record loaded', () => {
    expect(() => throwOnLoadError(ref(undefined))).not.toThrow()
    expect(() => throwOnLoadError(null)).not.toThrow()
  })

  it('shows the error page with the server\'s status and its words', () => {
    const refused = { statusCode: 404, data: { message: 'No such log in your workshop.' } }
    let thrown: unknown
    try {
      throwOnLoadError(ref(refused))
    }
    catch (error) {
      thrown = error
    }
    expect(thrown).toMatchObject({ statusCode: 404, message: 'No such log in your workshop.', fatal: true })
  })

  it('takes a record that gave no status for one that is not there', () => {
    expect(() => throwOnLoadError({})).toThrow(expect.objectContaining({ statusCode: 404 }))
  })
})
