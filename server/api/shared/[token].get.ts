export default defineEventHandler(async (event) => {
  const { token } = readParamsWith(event, tokenParams)
  const { log, vehicle, workshopName } = findSharedLog(token)
  // Read-only and without the uploader's details or the column mapping.
  const { mapping: _mapping, uploadedByName: _uploader, ...detail } = logDetail(log, vehicle)
  setResponseHeader(event, 'cache-control', 'private, no-store')
  return { workshopName, vehicleDescription: vehicle.description, log: detail, analysis: await storedAnalysis(log.id) }
})
