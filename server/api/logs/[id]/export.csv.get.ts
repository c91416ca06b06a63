const round = (value: number | null, digits: number) => value === null || !Number.isFinite(value) ? null : Number(value.toFixed(digits))

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log, vehicle } = findVisibleLog(actor, id)
  const analysis = await storedAnalysis(log.id)
  const lines = [
    csvLine(['Car', vehicle.description]),
    csvLine(['Log file', log.originalName]),
    csvLine(['Notes', log.notes]),
    csvLine(['How power lost is worked out', analysis.summary.powerLossBasis]),
    '',
    csvLine([
      'Pull', 'Start (s)', 'End (s)', 'Mean charge temperature (°C)', 'Peak charge temperature (°C)', 'Ambient temperature (°C)', 'Temperature over ambient (K)',
      'Boost (kPa abs)', 'Pre-cooler temperature (°C)', 'Effectiveness', 'Effectiveness measured or estimated', 'Density ratio (× standard air)',
      'Power lost vs coolest pull (%)', 'Power lost vs charge at ambient temperature (%)', 'Power lost vs coolest pull (kW)',
    ]),
    ...analysis.pulls.map(pull => csvLine([
      pull.index + 1, round(pull.startS, 1), round(pull.endS, 1), round(pull.meanChargeTempC, 2), round(pull.peakChargeTempC, 2),
      round(pull.ambientTempC, 2), round(pull.meanDeltaOverAmbientK, 2), round(pull.meanManifoldKpa, 1), round(pull.preCoolerTempC, 2),
      round(pull.effectiveness, 3), pull.effectivenessSource, round(pull.densityRatioIsa, 4), round(pull.powerLossVsCoolestPct, 2),
      round(pull.powerLossVsAmbientPct, 2), round(pull.powerLossVsCoolestKw, 2),
    ])),
  ]
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-disposition': contentDisposition(`densitas-log-${log.id}-pulls.csv`),
  })
  // A BOM so spreadsheet programs read the degree signs as UTF-8.
  return `\uFEFF${lines.join('\r\n')}\r\n`
})
