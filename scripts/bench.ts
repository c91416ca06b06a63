// Benchmark: import + analysis end to end from a file path, for 10 k, 100 k and 1 M-row logs with
// 8 channels. Each size runs in a fresh child process so its peak RSS is its own.
//   npm run bench            (all sizes)
//   npm run bench -- 1000000 (one size)
import { spawnSync } from 'node:child_process'
import { mkdtemp, rm, stat } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { analyseLog, importLog } from '../server/analysis/index'
import { RATE_HZ, writeLog } from './lib/synthetic-log'

const SIZES = [10_000, 100_000, 1_000_000]

interface ChildReport {
  rows: number
  importMs: number
  analyseMs: number
  baselineRssMb: number
  peakRssMb: number
  pulls: number
}

async function child(path: string): Promise<void> {
  const baselineRssMb = process.memoryUsage().rss / 1048576
  const t0 = performance.now()
  const log = await importLog({ path })
  const t1 = performance.now()
  const result = analyseLog(log)
  const t2 = performance.now()
  const report: ChildReport = {
    rows: log.rowCount,
    importMs: t1 - t0,
    analyseMs: t2 - t1,
    baselineRssMb,
    // maxRSS is in kilobytes (Node docs: process.resourceUsage()).
    peakRssMb: process.resourceUsage().maxRSS / 1024,
    pulls: result.summary.pullCount,
  }
  console.log(JSON.stringify(report))
}

async function parent(sizes: number[]): Promise<void> {
  const dir = await mkdtemp(join(tmpdir(), 'densitas-bench-'))
  const self = fileURLToPath(import.meta.url)
  // The child runs this script bundled to plain JavaScript, as a server would run it: the tsx
  // loader alone adds about 45 MB of RSS (transpiler and source maps), which is not the engine's cost.
  // (esbuild is the transpiler tsx itself uses; CommonJS output so papaparse's require() works.)
  const { build } = await import('esbuild')
  const bundle = join(dir, 'bench.cjs')
  await build({ entryPoints: [self], bundle: true, platform: 'node', format: 'cjs', target: 'node20', outfile: bundle, external: ['esbuild'], logLevel: 'error' })
  try {
    console.log(`Densitas import + analysis benchmark (node ${process.version}, ${RATE_HZ} Hz, 8 channels; one child process per size)`)
    console.log(['rows', 'file MB', 'import ms', 'analyse ms', 'total ms', 'rows/s', 'MB/s', 'base RSS MB', 'peak RSS MB', 'peak/file', 'pulls'].map(h => h.padStart(12)).join(''))
    for (const rows of sizes) {
      const path = join(dir, `bench-${rows}.csv`)
      await writeLog(path, rows)
      const bytes = (await stat(path)).size
      const run = spawnSync(process.execPath, [bundle, '--child', path], { encoding: 'utf8' })
      if (run.status !== 0) throw new Error(`child failed for ${rows} rows: ${run.stderr}`)
      const report = JSON.parse(run.stdout.trim().split('\n').pop()!) as ChildReport
      const totalMs = report.importMs + report.analyseMs
      const fileMb = bytes / 1048576
      console.log([
        report.rows.toLocaleString('en'), fileMb.toFixed(1), report.importMs.toFixed(0), report.analyseMs.toFixed(0), totalMs.toFixed(0),
        Math.round(report.rows / (totalMs / 1000)).toLocaleString('en'), (fileMb / (totalMs / 1000)).toFixed(1),
        report.baselineRssMb.toFixed(0), report.peakRssMb.toFixed(0), (report.peakRssMb / fileMb).toFixed(2), String(report.pulls),
      ].map(c => c.padStart(12)).join(''))
    }
  }
  finally {
    await rm(dir, { recursive: true, force: true })
  }
}

const argv = process.argv.slice(2)
const run = argv[0] === '--child' ? child(argv[1]!) : parent(argv.length ? argv.map(Number) : SIZES)
run.catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : String(error))
  process.exitCode = 1
})
