// Command line: analyse one log file and print the result.
//   npm run analyse -- FILE [--mapping MAPPING.json] [--json] [--ambient C] [--altitude M]
//                     [--baro KPA] [--humidity PCT] [--rated-kw KW] [--threshold PCT]
// Exit code 0 on success, 1 with the error message on a bad file or bad arguments.
import { readFile } from 'node:fs/promises'
import { analyseLog, importLog, isLogImportError } from '../server/analysis/index'
import type { AnalyseOptions, AnalysisResult } from '../server/analysis/index'

interface Args {
  file?: string
  mapping?: string
  json: boolean
  numbers: Record<string, number>
}

const NUMBER_FLAGS: Record<string, keyof AnalyseOptions> = {
  '--ambient': 'ambientTempC',
  '--altitude': 'altitudeM',
  '--baro': 'baroKpa',
  '--humidity': 'humidityPct',
  '--rated-kw': 'ratedPowerKw',
  '--threshold': 'pullThresholdPct',
}

const USAGE = 'Usage: npm run analyse -- FILE [--mapping MAPPING.json] [--json] [--ambient C] [--altitude M] [--baro KPA] [--humidity PCT] [--rated-kw KW] [--threshold PCT]'

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

function printTable(file: string, result: AnalysisResult): void {
  const s = result.summary
  const out: string[] = []
  out.push(`Log: ${file}`)
  out.push(`Duration ${fmt(s.durationS, 0)} s, ${s.sampleCount} samples, ambient ${fmt(s.ambientTempC)} °C (${s.ambientSource}), baro ${fmt(s.baroKpa, 2)} kPa (${s.baroSource}), masked ${fmt(s.maskedS, 0)} s`)
  out.push(`Pulls: ${s.pullCount} (${s.pullChannel ?? 'no load channel'} ≥ ${s.pullThresholdPct} %)`)
  if (result.pulls.length > 0) {
    const header = ['#', 'start s', 'end s', 'charge °C', 'peak °C', 'amb °C', 'ΔT K', 'MAP kPa', 'eff', 'src', 'σ ISA', 'loss vs coolest %']
    const rows = result.pulls.map(p => [
      String(p.index + 1), fmt(p.startS), fmt(p.endS), fmt(p.meanChargeTempC), fmt(p.peakChargeTempC), fmt(p.ambientTempC),
      fmt(p.meanDeltaOverAmbientK), fmt(p.meanManifoldKpa), fmt(p.effectiveness, 2), p.effectivenessSource ?? '–', fmt(p.densityRatioIsa, 3), fmt(p.powerLossVsCoolestPct, 2),
    ])
    const widths = header.map((h, c) => Math.max(h.length, ...rows.map(r => r[c]!.length)))
    const line = (cells: string[]) => cells.map((cell, c) => cell.padStart(widths[c]!)).join('  ')
    out.push(line(header))
    for (const row of rows) out.push(line(row))
    out.push(`Soak index ${fmt(s.soakIndexKPerPull, 2)} K/pull, rise ${fmt(s.chargeTempRiseK)} K, recovery τ ${fmt(s.recoveryTimeConstantS)} s, peak charge ${fmt(s.peakChargeTempC)} °C`)
    out.push(`Max loss vs coolest pull ${fmt(s.maxPowerLossVsCoolestPct, 2)} %, vs ambient ${fmt(s.maxPowerLossVsAmbientPct, 2)} % (${s.powerLossBasis})`)
    if (s.projection.atPullNumber !== null) out.push(`Projection: ${s.projection.lossPct} % loss at pull ${s.projection.atPullNumber} (${s.projection.morePulls} more). ${s.projection.assumption}`)
  }
  if (result.masks.length > 0) {
    out.push(`Masked spans: ${result.masks.length}`)
    for (const m of result.masks) out.push(`  ${fmt(m.startS)}–${fmt(m.endS)} s  ${m.reason}`)
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
  const log = await importLog({ path: args.file }, { mapping, altitudeM: options.altitudeM, baroKpa: options.baroKpa })
  const result = analyseLog(log, options)
  if (args.json) console.log(JSON.stringify(result, null, 2))
  else printTable(args.file, result)
}

main().catch((error: unknown) => {
  const message = isLogImportError(error) ? error.message : error instanceof Error ? error.message : String(error)
  console.error(`analyse: ${message}`)
  process.exitCode = 1
})
