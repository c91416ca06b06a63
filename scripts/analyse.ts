// Command line: analyse one log file and print the result.
//   npm run analyse -- FILE [--mapping MAPPING.json] [--json] [--ambient C] [--altitude M]
//                     [--baro KPA] [--humidity PCT] [--rated-kw KW] [--threshold PCT] [--drive N]
// A file holding several joined drives lists them; choose one with --drive N (1 = the first).
// Exit code 0 on success, 1 with the error message on a bad file or bad arguments.
import { readFile } from 'node:fs/promises'
import { analyseLog, importLog, isLogImportError, listDrives } from '../server/analysis/index'
import type { AnalyseOptions, AnalysisResult, DriveInfo } from '../server/analysis/index'

interface Args {
  file?: string
  mapping?: string
  json: boolean
  numbers: Record<string, number>
  /** 1-based, as the list prints it. */
  drive?: number
}

const NUMBER_FLAGS: Record<string, keyof AnalyseOptions> = {
  '--ambient': 'ambientTempC',
  '--altitude': 'altitudeM',
  '--baro': 'baroKpa',
  '--humidity': 'humidityPct',
  '--rated-kw': 'ratedPowerKw',
  '--threshold': 'pullThresholdPct',
}

const USAGE = 'Usage: npm run analyse -- FILE [--mapping MAPPING.json] [--json] [--ambient C] [--altitude M] [--baro KPA] [--humidity PCT] [--rated-kw KW] [--threshold PCT] [--drive N]'

function parseArgs(argv: string[]): Args {
  const args: Args = { json: false, numbers: {} }
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!
    if (arg === '--json') {
      args.json = true
    }
    else if (arg === '--mapping') {
      args.mapping = argv[++i]
      if (!args.mapping) throw new Error('--mapping needs a file name')
    }
    else if (arg === '--drive') {
      const text = argv[++i]
      const value = Number(text)
      if (text === undefined || !Number.isInteger(value) || value < 1) throw new Error('--drive needs a drive number (1 = the first drive of the file)')
      args.drive = value
    }
    else if (arg in NUMBER_FLAGS) {
      const text = argv[++i]
      const value = Number(text)
      if (text === undefined || !Number.isFinite(value)) throw new Error(`${arg} needs a number`)
      args.numbers[NUMBER_FLAGS[arg]!] = value
    }
    else if (arg === '--help' || arg === '-h') {
      console.log(USAGE)
      process.exit(0)
    }
    else if (arg.startsWith('--')) {
      throw new Error(`Unknown option ${arg}`)
    }
    else if (!args.file) {
      args.file = arg
    }
    else {
      throw new Error(`Only one file at a time (got "${args.file}" and "${arg}")`)
    }
  }
  return args
}

const fmt = (value: number | null | undefined, digits = 1): string => (value === null || value === undefined ? '–' : value.toFixed(digits))

const clock = (s: number) => {
  const day = ((s % 86400) + 86400) % 86400
  return `${String(Math.floor(day / 3600)).padStart(2, '0')}:${String(Math.floor(day / 60) % 60).padStart(2, '0')}:${String(Math.floor(day % 60)).padStart(2, '0')}`
}

function driveLines(drives: DriveInfo[]): string[] {
  return drives.map(d => `  ${d.index + 1}. starts at ${fmt(d.startS, 1)} s (${clock(d.startS)}), ${fmt(d.durationS / 60, 1)} min, ${d.rows} rows: ${d.contains}`)
}

function printTable(file: string, result: AnalysisResult, drives: DriveInfo[], drive: number | undefined): void {
  const s = result.summary
  const d = result.drive
  const out: string[] = []
  out.push(`Log: ${file}${drive ? ` — drive ${drive} of ${drives.length}` : ''}`)
  if (drives.length > 1) out.push('Drives in the file:', ...driveLines(drives))
  out.push(`Full-load rule (${s.fullLoadRule.source}): ${s.fullLoadRule.description}`)
  out.push(`Drive: running ${fmt(d.runningS / 60, 1)} min, moving ${fmt(d.movingS / 60, 1)} min, under boost ${fmt(d.boostedS / 60, 1)} min; charge over ambient ${result.driveDetail.basis === 'moving' ? 'while moving' : 'while running'}: median ${fmt(d.deltaOverAmbientK?.median)} K, p95 ${fmt(d.deltaOverAmbientK?.p95)} K, max ${fmt(d.deltaOverAmbientK?.max)} K; under boost median ${fmt(d.deltaOverAmbientUnderBoostK?.median)} K, p95 ${fmt(d.deltaOverAmbientUnderBoostK?.p95)} K`)
  out.push(`  over ambient by >10/20/30 K: ${result.driveDetail.timeOverAmbientS.map(o => fmt(o.s, 0)).join(' / ')} s; by third of the drive (median K): ${result.driveDetail.thirds.map(t => fmt(t.medianK)).join(', ')}`)
  out.push(`Soak events: ${d.soakEvents.length}${result.driveDetail.hasSpeed ? '' : ' (no road speed in the log)'}`)
  for (const e of d.soakEvents) out.push(`  ${fmt(e.startS)}–${fmt(e.endS)} s  rise ${fmt(e.riseK)} K  recovery ${e.recoveryS === null ? 'not seen' : `${fmt(e.recoveryS, 0)} s`}`)
  out.push(`Duration ${fmt(s.durationS, 0)} s, ${s.sampleCount} samples, ambient ${fmt(s.ambientTempC)} °C (${s.ambientSource}), baro ${fmt(s.baroKpa, 2)} kPa (${s.baroSource}), masked ${fmt(s.maskedS, 0)} s`)
  out.push(`Pulls: ${s.pullCount} of ${s.foundPullCount} found (${result.pulls.filter(p => p.kind === 'sustained').length} sustained)`)
  if (result.pulls.length > 0) {
    const header = ['#', 'kind', 'start s', 'end s', 'charge °C', 'peak °C', 'amb °C', 'ΔT K', 'MAP kPa', 'eff', 'src', 'σ ISA', 'loss vs coolest %']
    const rows = result.pulls.map(p => [
      String(p.index + 1), p.kind, fmt(p.startS), fmt(p.endS), fmt(p.meanChargeTempC), fmt(p.peakChargeTempC), fmt(p.ambientTempC),
      fmt(p.meanDeltaOverAmbientK), fmt(p.meanManifoldKpa), fmt(p.effectiveness, 2), p.effectivenessSource ?? '–', fmt(p.densityRatioIsa, 3), fmt(p.powerLossVsCoolestPct, 2),
    ])
    const widths = header.map((h, c) => Math.max(h.length, ...rows.map(r => r[c]!.length)))
    const line = (cells: string[]) => cells.map((cell, c) => cell.padStart(widths[c]!)).join('  ')
    out.push(line(header))
    for (const row of rows) out.push(line(row))
    out.push(`Soak index ${fmt(s.soakIndexKPerPull, 2)} K/pull, rise ${fmt(s.chargeTempRiseK)} K, recovery τ ${fmt(s.recoveryTimeConstantS)} s, peak charge ${fmt(s.peakChargeTempC)} °C`)
    out.push(`Effectiveness: measured ${fmt(s.meanEffectivenessMeasured, 2)} (${s.measuredPullCount} pulls), estimated ${fmt(s.meanEffectivenessEstimated, 2)} (${s.estimatedPullCount} pulls, reads low)`)
    out.push(`Loss normalised (${s.lossNormalisation.method}): ${s.lossNormalisation.note}`)
    out.push(`Max loss vs coolest pull ${fmt(s.maxPowerLossVsCoolestPct, 2)} %, vs ambient ${fmt(s.maxPowerLossVsAmbientPct, 2)} % (${s.powerLossBasis})`)
    if (s.projection.atPullNumber !== null) out.push(`Projection: ${s.projection.lossPct} % loss at pull ${s.projection.atPullNumber} (${s.projection.morePulls} more). ${s.projection.assumption}`)
  }
  if (result.masks.length > 0) {
    out.push(`Masked spans: ${result.masks.length}`)
    for (const m of result.masks) out.push(`  ${fmt(m.startS)}–${fmt(m.endS)} s  ${m.reason}${m.channel ? ` (${m.channel})` : ''}`)
  }
  if (result.warnings.length > 0) {
    out.push('Warnings:')
    for (const w of result.warnings) out.push(`  - ${w.message}`)
  }
  console.log(out.join('\n'))
}

async function main(): Promise<void> {
  const args = parseArgs(process.argv.slice(2))
  if (!args.file) throw new Error(USAGE)
  const mapping = args.mapping ? await readFile(args.mapping, 'utf8') : undefined
  const options = args.numbers as Partial<AnalyseOptions>
  const importOptions = { mapping, altitudeM: options.altitudeM, baroKpa: options.baroKpa }
  const drives = await listDrives({ path: args.file }, importOptions)
  if (drives.length > 1 && args.drive === undefined) {
    throw new Error(`${args.file} holds ${drives.length} drives joined together:\n${driveLines(drives).join('\n')}\nChoose one with --drive N.`)
  }
  if (args.drive !== undefined && args.drive > drives.length) throw new Error(`The file holds ${drives.length} drive(s); there is no drive ${args.drive}.`)
  const drive = drives.length > 1 ? args.drive : undefined
  const log = await importLog({ path: args.file }, { ...importOptions, drive: drive === undefined ? undefined : drive - 1 })
  const result = analyseLog(log, options)
  if (args.json) console.log(JSON.stringify(result, null, 2))
  else printTable(args.file, result, drives, drive)
}

main().catch((error: unknown) => {
  const message = isLogImportError(error) ? error.message : error instanceof Error ? error.message : String(error)
  console.error(`analyse: ${message}`)
  process.exitCode = 1
})
