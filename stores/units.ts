import { defineStore } from 'pinia'

export type TemperatureUnit = 'C' | 'F'
export type PressureUnit = 'kPa' | 'bar' | 'psi'
export type PowerUnit = 'kW' | 'hp' | 'PS'

// Display units for this person. Results from the API are SI; these only change how they are shown.
export const useUnitsStore = defineStore('units', () => {
  const { user } = useUserSession()
  const temperature = ref<TemperatureUnit>((user.value?.preferences?.temperature as TemperatureUnit) ?? 'C')
  const pressure = ref<PressureUnit>((user.value?.preferences?.pressure as PressureUnit) ?? 'kPa')
  const power = ref<PowerUnit>((user.value?.preferences?.power as PowerUnit) ?? 'kW')

  async function save() {
    await $fetch('/api/me', { method: 'PATCH', body: { preferences: { temperature: temperature.value, pressure: pressure.value, power: power.value } } })
  }

  return { temperature, pressure, power, save }
})
