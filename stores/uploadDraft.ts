import { defineStore } from 'pinia'
import type { ChannelId, ColumnInfo, DetectResponse, LogMapping, LogProfile, MappingInput } from '#shared/types/report'
import { MAPPABLE_CHANNELS } from '#shared/quantities/channels'
import { conditionBoundMessage, conditionInBounds, type ConditionKey } from '#shared/utils/conditions'

export interface DraftChannel {
  /** Header of the chosen column; '' when the channel is not in the file. */
  column: string
  unit: string
}

export type DraftMapping = Record<ChannelId, DraftChannel>

export interface DraftConditions {
  ambientTempC: number | null
  altitudeM: number | null
  baroKpa: number | null
  humidityPct: number | null
}

function emptyMapping(): DraftMapping {
  return Object.fromEntries(MAPPABLE_CHANNELS.map(c => [c.id, { column: '', unit: c.units[0]! }])) as DraftMapping
}

function emptyConditions(): DraftConditions {
  return { ambientTempC: null, altitudeM: null, baroKpa: null, humidityPct: null }
}

// The column mapping being prepared for an upload: what the engine detected, what the person
// changed, and the conditions the log lacks. Client state only; the server re-checks everything.
export const useUploadDraftStore = defineStore('uploadDraft', () => {
  const columns = ref<ColumnInfo[]>([])
  const detected = ref<LogMapping>({})
  const headerSignature = ref('')
  const needsBaroHint = ref(false)
  /** Per column, the unit its values suggest for each channel it could be (from the server). */
  const unitGuesses = ref<Record<string, Partial<Record<string, string>>>>({})
  /** Numeric columns no channel took, whose values fit one: offered to the person. */
  const unrecognised = ref<string[]>([])
  const mapping = ref<DraftMapping>(emptyMapping())
  const conditions = ref<DraftConditions>(emptyConditions())
  const pressureSource = ref<'altitude' | 'baro'>('altitude')
  const profileId = ref<number | null>(null)
  const profileName = ref('')
  const saveAsProfile = ref(false)
  const newProfileName = ref('')

  function loadDetected(answer: Pick<DetectResponse, 'columns' | 'mapping' | 'headerSignature' | 'needsBaro'> & Partial<Pick<DetectResponse, 'unitGuesses' | 'unrecognised'>>) {
    columns.value = answer.columns
    unitGuesses.value = answer.unitGuesses ?? {}
    unrecognised.value = answer.unrecognised ?? []
    detected.value = answer.mapping
    headerSignature.value = answer.headerSignature
    needsBaroHint.value = answer.needsBaro
    const next = emptyMapping()
    const fixed = emptyConditions()
    for (const channel of MAPPABLE_CHANNELS) {
      const entry = answer.mapping[channel.id]
      if (!entry) continue
      if (entry.column) next[channel.id] = { column: entry.column, unit: entry.unit }
      else if (entry.value !== undefined && entry.source === 'entered') {
        if (channel.id === 'ambientTemp') fixed.ambientTempC = entry.value
        if (channel.id === 'baro') fixed.baroKpa = entry.value
        if (channel.id === 'humidity') fixed.humidityPct = entry.value
      }
    }
    mapping.value = next
    conditions.value = fixed
    profileId.value = null
    profileName.value = ''
  }

  /** A saved profile's mapping over the detected one, for the columns this file has. */
  function applyProfile(profile: LogProfile) {
    const headers = new Set(columns.value.map(c => c.header))
    for (const channel of MAPPABLE_CHANNELS) {
      if (!(channel.id in profile.mapping)) continue
      const entry = profile.mapping[channel.id]
      if (!entry) {
        mapping.value[channel.id] = { column: '', unit: mapping.value[channel.id].unit }
        continue
      }
      if (entry.column && headers.has(entry.column)) {
        mapping.value[channel.id] = { column: entry.column, unit: entry.unit ?? mapping.value[channel.id].unit }
      }
    }
    profileId.value = profile.id
    profileName.value = profile.name
  }

  function reset() {
    columns.value = []
    detected.value = {}
    headerSignature.value = ''
    needsBaroHint.value = false
    unitGuesses.value = {}
    unrecognised.value = []
    mapping.value = emptyMapping()
    conditions.value = emptyConditions()
    pressureSource.value = 'altitude'
    profileId.value = null
    profileName.value = ''
    saveAsProfile.value = false
    newProfileName.value = ''
  }

  /** Whether the person changed the engine's choice for a channel. */
  function isChanged(id: ChannelId): boolean {
    const auto = detected.value[id]
    const now = mapping.value[id]
    return (auto?.column ?? '') !== now.column || (now.column !== '' && auto?.unit !== now.unit)
  }

  const needsAmbientTemp = computed(() => mapping.value.ambientTemp.column === '')
  const hasPressureSource = computed(() => mapping.value.baro.column !== '')

  /** What stops the upload, in words for the person. */
  const problems = computed(() => {
    const list: { field: string, message: string }[] = []
    if (!mapping.value.time.column) list.push({ field: 'time', message: 'Choose the column that holds the time of each row.' })
    if (!mapping.value.chargeTemp.column) list.push({ field: 'chargeTemp', message: 'Choose the column with the charge air temperature (after the intercooler, often called intake air temperature).' })
    const ambient = conditions.value.ambientTempC
    if (needsAmbientTemp.value && (ambient === null || !Number.isFinite(ambient))) {
      list.push({ field: 'ambientTempC', message: 'This log has no ambient temperature. Enter the ambient temperature during the pulls.' })
    }
    else if (needsAmbientTemp.value && ambient !== null && !conditionInBounds('ambientTempC', ambient)) {
      list.push({ field: 'ambientTempC', message: `${conditionBoundMessage('ambientTempC')}.` })
    }
    // The same bounds as the server's (shared/utils/conditions.ts); only the value that is sent counts.
    const pressureKey = pressureSource.value === 'baro' ? 'baroKpa' : 'altitudeM'
    const others: ConditionKey[] = [...(hasPressureSource.value ? [] : [pressureKey] as const), 'humidityPct']
    for (const key of others) {
      const value = conditions.value[key]
      if (value !== null && !conditionInBounds(key, value)) list.push({ field: key, message: `${conditionBoundMessage(key)}.` })
    }
    const used = new Map<string, ChannelId>()
    for (const channel of MAPPABLE_CHANNELS) {
      const column = mapping.value[channel.id].column
      if (!column) continue
      const other = used.get(column)
      if (other) list.push({ field: channel.id, message: `Column "${column}" is chosen twice. Each column feeds one channel.` })
      used.set(column, channel.id)
    }
    if (saveAsProfile.value && !newProfileName.value.trim()) list.push({ field: 'profileName', message: 'Give the log profile a name, or untick "Save these columns as a log profile".' })
    return list
  })

  /**
   * The mapping JSON for the upload and for a profile: every channel with its column and unit,
   * and null for channels the engine had mapped but the person cleared.
   */
  const mappingInput = computed<MappingInput>(() => {
    const out: MappingInput = {}
    for (const channel of MAPPABLE_CHANNELS) {
      const entry = mapping.value[channel.id]
      if (entry.column) out[channel.id] = { column: entry.column, unit: entry.unit }
      else if (detected.value[channel.id]?.column) out[channel.id] = null
    }
    return out
  })

  return {
    columns, detected, headerSignature, needsBaroHint, unitGuesses, unrecognised, mapping, conditions, pressureSource,
    profileId, profileName, saveAsProfile, newProfileName,
    needsAmbientTemp, hasPressureSource, problems, mappingInput,
    loadDetected, applyProfile, reset, isChanged,
  }
})
