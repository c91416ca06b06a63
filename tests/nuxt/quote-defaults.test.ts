import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { readBody, setResponseStatus } from 'h3'
import { describe, expect, it, vi } from 'vitest'
import QuoteDefaults from '~/components/workshop/QuoteDefaults.vue'

const current = { taxRatePct: 20, quoteValidityDays: 30, quoteTerms: 'Deposit books the job.' }

// What the form sent to PATCH /api/workshop, and what the stand-in server answers.
const sent: unknown[] = []
let answer: { status: number, message: string } | null = null
registerEndpoint('/api/workshop', {
  method: 'PATCH',
  handler: async (event) => {
    sent.push(await readBody(event))
    if (answer) {
      // The body Nitro sends for a refused request.
      setResponseStatus(event, answer.status)
      return { statusCode: answer.status, message: answer.message }
    }
    return { ...current }
  },
})

describe('WorkshopQuoteDefaults', () => {
  it('shows the saved tax rate, validity and terms', async () => {
    const wrapper = await mountSuspended(QuoteDefaults, { props: { current } })
    expect((wrapper.find('#ws-tax').element as HTMLInputElement).value).toBe('20')
    expect((wrapper.find('#ws-validity').element as HTMLInputElement).value).toBe('30')
    expect((wrapper.find('#ws-terms').element as HTMLTextAreaElement).value).toBe('Deposit books the job.')
  })

  it('sends only the fields changed, and says it saved', async () => {
    sent.length = 0
    answer = null
    const wrapper = await mountSuspended(QuoteDefaults, { props: { current } })
    await wrapper.find('#ws-tax').setValue('8.25')
    await wrapper.find('#ws-terms').setValue('Balance on collection.')
    await wrapper.find('form').trigger('submit')
    await vi.waitFor(() => expect(wrapper.find('[data-testid="quote-defaults-saved"]').exists()).toBe(true))
    expect(sent).toEqual([{ taxRatePct: 8.25, quoteTerms: 'Balance on collection.' }])
    expect(wrapper.emitted('saved')).toHaveLength(1)
  })

  it('sends nothing when nothing changed', async () => {
    sent.length = 0
    const wrapper = await mountSuspended(QuoteDefaults, { props: { current } })
    await wrapper.find('form').trigger('submit')
    await vi.waitFor(() => expect(wrapper.find('[data-testid="quote-defaults-saved"]').text()).toBe('Nothing changed.'))
    expect(sent).toEqual([])
    expect(wrapper.emitted('saved')).toBeUndefined()
  })

  it('shows the server\'s message when it refuses a value', async () => {
    sent.length = 0
    answer = { status: 400, message: 'Please check the form — Quote validity: a quote is valid for 1 to 365 days. Correct it and try again.' }
    const wrapper = await mountSuspended(QuoteDefaults, { props: { current } })
    await wrapper.find('#ws-validity').setValue('400')
    await wrapper.find('form').trigger('submit')
    await vi.waitFor(() => expect(wrapper.find('[data-testid="quote-defaults-error"]').text()).toMatch(/a quote is valid for 1 to 365 days/))
    expect(sent).toEqual([{ quoteValidityDays: 400 }])
    expect(wrapper.emitted('saved')).toBeUndefined()
    answer = null
  })
})
