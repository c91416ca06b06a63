import { mountSuspended } from '@nuxt/test-utils/runtime'
import { beforeEach, describe, expect, it } from 'vitest'
import MappingForm from '~/components/upload/MappingForm.vue'
import type { ColumnInfo, DetectResponse } from '#shared/types/report'

function column(index: number, header: string, samples: string[], unit?: ColumnInfo['unit']): ColumnInfo {
  return { index, header, name: header, unit, kind: 'numeric', samples, numericShare: 1, numericCount: samples.length, emptyShare: 0, median: 0, min: 0, max: 0, medianStep: 0 }
}

// A logger whose charge-air column the engine could not tell from the coolant one.
const columns = [
  column(0, 'Time (s)', ['0.0', '0.1']),
  column(1, 'Temp A', ['41', '42']),
  column(2, 'Temp B (°F)', ['104', '106'], 'degF'),
  column(3, 'MAP (kPa)', ['101', '180'], 'kPa'),
  column(4, 'Pedal (%)', ['0', '100']),
]
const answer: Pick<DetectResponse, 'columns' | 'mapping' | 'headerSignature' | 'needsBaro'> = {
  columns,
  headerSignature: 'abc123',
  needsBaro: false,
  mapping: {
    time: { column: 'Time (s)', unit: 's', confidence: 0.95, source: 'auto', unitSource: 'header' },
    chargeTemp: { column: 'Temp A', unit: 'degC', confidence: 0.45, source: 'auto', unitSource: 'guessed' },
    manifoldPressure: { column: 'MAP (kPa)', unit: 'kPa', confidence: 0.9, source: 'auto', unitSource: 'header' },
    pedal: { column: 'Pedal (%)', unit: '%', confidence: 0.7, source: 'auto', unitSource: 'header' },
  },
}

describe('MappingForm', () => {
  beforeEach(() => {
    const draft = useUploadDraftStore()
    draft.reset()
    draft.loadDetected(answer)
  })

  it('shows each channel with the detected column and how sure the match is', async () => {
    const wrapper = await mountSuspended(MappingForm)
    const charge = wrapper.find('[data-testid="mapping-row-chargeTemp"]')
    expect((charge.find('select').element as HTMLSelectElement).value).toBe('Temp A')
    expect(charge.find('[data-testid="confidence-badge"]').text()).toBe('Unsure · 45 %')
    expect(wrapper.find('[data-testid="mapping-row-time"] [data-testid="confidence-badge"]').text()).toBe('Sure · 95 %')
    expect(wrapper.find('[data-testid="mapping-row-pedal"] [data-testid="confidence-badge"]').text()).toBe('Likely · 70 %')
    expect(wrapper.find('[data-testid="mapping-row-ambientTemp"] [data-testid="confidence-badge"]').text()).toBe('Not found')
  })

  it('asks for the ambient temperature when the log has none, and stops asking once a column is chosen', async () => {
    const wrapper = await mountSuspended(MappingForm, { props: { showErrors: true } })
    const draft = useUploadDraftStore()
    expect(wrapper.find('[data-testid="ambient-prompt"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="condition-ambient"]').exists()).toBe(true)
    expect(draft.problems.map(p => p.field)).toContain('ambientTempC')
    await wrapper.find('[data-testid="condition-ambient"]').setValue('31')
    expect(draft.conditions.ambientTempC).toBe(31)
    expect(draft.problems.map(p => p.field)).not.toContain('ambientTempC')
  })

  it('takes a corrected column with the unit its header names, and marks it as set by the person', async () => {
    const wrapper = await mountSuspended(MappingForm)
    const draft = useUploadDraftStore()
    await wrapper.find('[data-testid="mapping-column-chargeTemp"]').setValue('Temp B (°F)')
    expect(draft.mapping.chargeTemp).toEqual({ column: 'Temp B (°F)', unit: 'degF' })
    expect(wrapper.find('[data-testid="mapping-row-chargeTemp"] [data-testid="confidence-badge"]').text()).toBe('Set by you')
    expect((wrapper.find('[data-testid="mapping-unit-chargeTemp"]').element as HTMLSelectElement).value).toBe('degF')
    expect(draft.mappingInput.chargeTemp).toEqual({ column: 'Temp B (°F)', unit: 'degF' })
  })

  it('lets the person change a unit', async () => {
    const wrapper = await mountSuspended(MappingForm)
    const draft = useUploadDraftStore()
    await wrapper.find('[data-testid="mapping-unit-manifoldPressure"]').setValue('bar')
    expect(draft.mapping.manifoldPressure.unit).toBe('bar')
    expect(draft.isChanged('manifoldPressure')).toBe(true)
  })

  it('sends a cleared channel as null so the server does not map it again', async () => {
    const wrapper = await mountSuspended(MappingForm)
    await wrapper.find('[data-testid="mapping-column-pedal"]').setValue('')
    expect(useUploadDraftStore().mappingInput.pedal).toBeNull()
  })

  it('refuses the same column for two channels', async () => {
    const wrapper = await mountSuspended(MappingForm, { props: { showErrors: true } })
    await wrapper.find('[data-testid="mapping-column-preCoolerTemp"]').setValue('Temp A')
    expect(useUploadDraftStore().problems.some(p => /chosen twice/.test(p.message))).toBe(true)
    expect(wrapper.find('[data-testid="mapping-row-preCoolerTemp"]').text()).toMatch(/chosen twice/)
  })

  it('offers to save a profile only where allowed, and then wants a name', async () => {
    expect((await mountSuspended(MappingForm)).find('[data-testid="save-profile"]').exists()).toBe(false)
    const wrapper = await mountSuspended(MappingForm, { props: { canSaveProfile: true, showErrors: true } })
    await wrapper.find('[data-testid="save-profile"]').setValue(true)
    const draft = useUploadDraftStore()
    expect(draft.problems.map(p => p.field)).toContain('profileName')
    await wrapper.find('[data-testid="profile-name"]').setValue('Dash logger')
    expect(draft.problems.map(p => p.field)).not.toContain('profileName')
  })

  it('applies a saved profile for the columns this file has', async () => {
    const draft = useUploadDraftStore()
    draft.applyProfile({ id: 7, name: 'Dash logger', mapping: { chargeTemp: { column: 'Temp B (°F)', unit: 'degF' }, ambientTemp: { column: 'Not in this file', unit: 'degC' } } })
    const wrapper = await mountSuspended(MappingForm)
    expect(draft.mapping.chargeTemp.column).toBe('Temp B (°F)')
    expect(draft.mapping.ambientTemp.column).toBe('')
    expect(wrapper.find('[data-testid="mapping-row-chargeTemp"] [data-testid="confidence-badge"]').text()).toBe('Set by you')
    expect(wrapper.find('[data-testid="mapping-row-time"] [data-testid="confidence-badge"]').text()).toBe('From profile')
  })

  it('asks for the ambient temperature in words, with the range it accepts', async () => {
    const wrapper = await mountSuspended(MappingForm, { props: { showErrors: true } })
    expect(wrapper.find('[data-testid="ambient-prompt"]').text()).toBe('This log has no ambient temperature. Enter the ambient temperature during the pulls — without it the charge air cannot be compared with the air going in.')
    expect(wrapper.text()).toContain('This log has no ambient temperature. Enter the ambient temperature during the pulls.')
    await wrapper.find('[data-testid="condition-ambient"]').setValue('75')
    expect(wrapper.text()).toContain('The ambient temperature must be between −40 and 60 °C.')
    await wrapper.find('[data-testid="condition-ambient"]').setValue('28,5')
    expect(useUploadDraftStore().conditions.ambientTempC).toBe(28.5)
    expect(wrapper.text()).not.toContain('must be between')
  })

  it('does not ask for ambient once the log has an ambient column', async () => {
    const draft = useUploadDraftStore()
    draft.loadDetected({ ...answer, mapping: { ...answer.mapping, ambientTemp: { column: 'Temp B (°F)', unit: 'degF', confidence: 0.8, source: 'auto', unitSource: 'header' } } })
    const wrapper = await mountSuspended(MappingForm, { props: { showErrors: true } })
    expect(wrapper.find('[data-testid="ambient-prompt"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="condition-ambient"]').exists()).toBe(false)
    expect(draft.problems.map(p => p.field)).not.toContain('ambientTempC')
  })

  it('asks for the site pressure when the log has boost but no barometric pressure', async () => {
    const draft = useUploadDraftStore()
    draft.loadDetected({ ...answer, needsBaro: true })
    const wrapper = await mountSuspended(MappingForm)
    expect(wrapper.find('[data-testid="upload-conditions"]').text()).toContain('The log has boost but no barometric pressure: give one of these, or sea level is assumed.')
    expect(wrapper.find('[data-testid="condition-altitude"]').exists()).toBe(true)
  })

  it('says which column is missing when the charge temperature is cleared', async () => {
    const wrapper = await mountSuspended(MappingForm, { props: { showErrors: true } })
    await wrapper.find('[data-testid="mapping-column-chargeTemp"]').setValue('')
    expect(wrapper.find('[data-testid="mapping-row-chargeTemp"]').text()).toContain('Choose the column with the charge air temperature (after the intercooler, often called intake air temperature).')
  })
})

describe('MappingForm with columns the engine did not recognise', () => {
  it('offers them with the channels their values fit and the unit guessed from the values', async () => {
    const draft = useUploadDraftStore()
    draft.reset()
    draft.loadDetected({ ...answer, unrecognised: ['Temp B (°F)', 'Col 7'], unitGuesses: { 'Temp B (°F)': { ambientTemp: 'degF', chargeTemp: 'degF' }, 'Col 7': { preCoolerTemp: 'K' } } })
    const wrapper = await mountSuspended(MappingForm)
    const offer = wrapper.find('[data-testid="mapping-unrecognised"]')
    expect(offer.exists()).toBe(true)
    // chargeTemp is taken already, so only the ambient temperature is offered for "Temp B".
    const select = wrapper.find('[data-testid="unrecognised-Temp B (°F)"] select')
    expect(select.findAll('option').map(o => o.text())).toEqual(['Not used', 'Ambient temperature, in °F'])
    await select.setValue('ambientTemp')
    expect(draft.mapping.ambientTemp).toEqual({ column: 'Temp B (°F)', unit: 'degF' })
    expect(wrapper.find('[data-testid="unrecognised-Temp B (°F)"]').exists()).toBe(false)
  })
})
