export default defineEventHandler(async (event) => {
  const { token } = readParamsWith(event, tokenParams)
  setResponseHeader(event, 'cache-control', 'private, no-store')
  const link = findShareLink(token)
  if (link.comparisonId !== null) {
    const { comparison, vehicle, workshopName } = findSharedComparison(token)
    return sharedComparisonView(comparison, vehicle, workshopName)
  }
  const { log, vehicle, workshopName } = findSharedLog(token)
  // Read-only and without the uploader's details or the column mapping.
  const { mapping: _mapping, uploadedByName: _uploader, ...detail } = logDetail(log, vehicle)
  return { kind: 'log' as const, workshopName, vehicleDescription: vehicle.description, log: detail, analysis: await storedAnalysis(log.id) }
})
