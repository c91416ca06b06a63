// The on-screen name of each request field, for messages a web user reads: a checked form field
// must never come back as `vehicleId: …`. One place; fields not listed are humanised from the name.

import { CHANNELS, VALUE_CHANNEL_IDS } from '../quantities/channels'
import { CONDITION_BOUNDS } from './conditions'

const FIELD_LABELS: Record<string, string> = {
  // The route's id and a token both come from a link a person opened.
  id: 'link',
  token: 'link',
  // A channel (a column mapping's key) by the channel catalogue's word: "chargeTemp" → "charge temperature".
  ...Object.fromEntries(VALUE_CHANNEL_IDS.map(id => [id, CHANNELS[id].label.toLowerCase()])),
  // A log's conditions by the words the upload form uses: "baroKpa" → "barometric pressure".
  ...Object.fromEntries(Object.entries(CONDITION_BOUNDS).map(([key, bound]) => [key, bound.label])),
  vehicleId: 'car',
  ownerId: 'customer',
  ownerName: 'customer\'s name',
  emailDriver: 'e-mail to the customer',
  fittedCoreId: 'fitted core',
  coreId: 'core fitted when the log was made',
  candidateCoreIds: 'cores to compare',
  logId: 'log',
  sizingId: 'sizing',
  profileId: 'log profile',
  ambientC: 'ambient temperature',
  referenceAmbientC: 'reference ambient',
  boostKpaAbs: 'boost (kPa abs)',
  roadSpeedKmh: 'road speed',
  targetPowerKw: 'target power',
  ratedPowerKw: 'rated power',
  displacementL: 'engine size',
  correctionStandard: 'correction standard',
  currentPassword: 'current password',
  depositPercent: 'deposit',
  labourRateCents: 'labour rate',
  taxRatePct: 'tax rate',
  quoteValidityDays: 'quote validity',
  quoteTerms: 'quote terms',
  unitPriceCents: 'price',
  endTankLayout: 'end tanks',
  finDensity: 'fin density',
  finDensityUnit: 'fin density unit',
  expiresInDays: 'how long the link works',
  recordedOn: 'day of the pulls',
  runOn: 'day of the dyno run',
  startS: 'start time',
  endS: 'end time',
  thresholdPct: 'pedal threshold',
  keepLeftOut: 'keep the pulls left out',
  pullEdits: 'pull changes',
  headerSignature: 'column headings',
  fileName: 'file name',
  workshopName: 'workshop name',
  pageSize: 'page size',
  degC: '°C',
  depositPct: 'deposit',
  powerKw: 'measured power',
  torqueNm: 'torque',
  priceCents: 'sell price',
  costCents: 'cost',
  faceWidthMm: 'face width',
  faceHeightMm: 'face height',
  depthMm: 'depth',
  inletDiameterMm: 'inlet diameter',
  outletDiameterMm: 'outlet diameter',
  weightKg: 'weight',
  uaWPerK: 'heat conductance (UA)',
  email: 'e-mail address',
  q: 'search',
  dir: 'sort order',
  channels: 'sensors',
  from: 'start of the chart',
  to: 'end of the chart',
  points: 'chart points',
}

/** "vehicleId" → "car"; an unlisted "someFieldName" → "some field name" (an "Id" ending dropped). */
export function fieldLabel(name: string): string {
  if (FIELD_LABELS[name]) return FIELD_LABELS[name]
  return name
    .replace(/Ids?$/, '')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/_/g, ' ')
    .toLowerCase()
    .trim()
}

/** A checked field's path as words: ["lines", 2, "unitPriceCents"] → "price (line 3)". */
export function fieldPathLabel(path: readonly PropertyKey[]): string {
  const names = path.filter((p): p is string => typeof p === 'string')
  const index = path.find((p): p is number => typeof p === 'number')
  const last = names.at(-1)
  if (!last) return index == null ? '' : `item ${index + 1}`
  const label = fieldLabel(last)
  return index == null ? label : `${label} (${fieldLabel(names[0] ?? 'item').replace(/s$/, '')} ${index + 1})`
}
