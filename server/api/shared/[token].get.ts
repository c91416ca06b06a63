import type { SharedReport } from '#shared/types/report'

// Exactly what the shared page shows, nothing more: no ids of people, the workshop, the car or the
// log, no file name or column mapping, no staff notes on the car. The tuner's notes on the log are
// written for the customer and shown on the page.
export default defineEventHandler(async (event) => {
  const { token } = readParamsWith(event, tokenParams)
  setResponseHeader(event, 'cache-control', 'private, no-store')
  const link = findShareLink(token)
  if (link.comparisonId !== null) {
    const { comparison, vehicle, workshopName } = findSharedComparison(token)
    return sharedComparisonView(comparison, vehicle, workshopName)
  }
  const { log, vehicle, workshopName } = findSharedLog(token)
  return {
    kind: 'log' as const,
    workshopName,
    vehicleDescription: vehicle.description,
    log: {
      recordedOn: log.recordedOn,
      createdAt: log.createdAt.toISOString(),
      notes: log.notes,
      vehicle: { ratedPowerKw: vehicle.ratedPowerKw, fuel: vehicle.fuel },
    },
    analysis: await storedAnalysis(log.id),
  } satisfies SharedReport
})
