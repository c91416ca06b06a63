import { defineStore } from 'pinia'
import { displayUnitOr, type DisplayPowerUnit, type DisplayPressureUnit, type DisplayTemperatureUnit } from '#shared/quantities/display'

// Display units for this person (the choices are the unit catalogue's, shared/quantities/display.ts).
// Results from the API are SI; these only change how they are shown.
export const useUnitsStore = defineStore('units', () => {
  const { user } = useUserSession()
  const saved = user.value?.preferences
  const temperature = ref<DisplayTemperatureUnit>(displayUnitOr('temperature', saved?.temperature))
  const pressure = ref<DisplayPressureUnit>(displayUnitOr('pressure', saved?.pressure))
  const power = ref<DisplayPowerUnit>(displayUnitOr('power', saved?.power))

  async function save() {
    await $fetch('/api/me', { method: 'PATCH', body: { preferences: { temperature: temperature.value, pressure: pressure.value, power: power.value } } })
  }

  return { temperature, pressure, power, save }
})
