import { mountSuspended } from '@nuxt/test-utils/runtime'
import { createError } from 'h3'
import { describe, expect, it } from 'vitest'
import ErrorPage from '~/error.vue'

const failed = (statusCode: number, message: string) => createError({ statusCode, message }) as never

describe('the error page', () => {
  it('says plainly that there is no page at an unknown address, without echoing the path', async () => {
    const wrapper = await mountSuspended(ErrorPage, { props: { error: failed(404, 'Page not found: /no-such-page') } })
    expect(wrapper.find('h1').text()).toBe('Nothing here')
    expect(wrapper.find('[data-testid="error-message"]').text()).toBe('There is no page at this address. Check it for a typing mistake, or go back to the start.')
    expect(wrapper.text()).not.toContain('/no-such-page')
    expect(wrapper.find('[data-testid="error-home"]').text()).toBe('Back to the start')
  })

  it('keeps the server\'s own words for a record that is not there', async () => {
    const message = 'Car not found. It may have been deleted, or it belongs to another workshop. Open it again from the list.'
    const wrapper = await mountSuspended(ErrorPage, { props: { error: failed(404, message) } })
    expect(wrapper.find('[data-testid="error-message"]').text()).toBe(message)
  })
})
