// The command line as a tuner runs it.
import { spawnSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { generateDemoLog } from '../../../server/analysis/index'

const root = fileURLToPath(new URL('../../../', import.meta.url))
const dir = mkdtempSync(join(tmpdir(), 'densitas-cli-'))
const run = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'scripts/analyse.ts', ...args], { cwd: root, encoding: 'utf8' })

describe('npm run analyse', () => {
  const good = join(dir, 'demo.csv')
  writeFileSync(good, generateDemoLog('stock-core-hot-day').csv)

  it('prints JSON with --json', () => {
    const out = run(good, '--json')
    expect(out.status).toBe(0)
    const result = JSON.parse(out.stdout)
    expect(Object.keys(result)).toEqual(['summary', 'drive', 'driveDetail', 'pulls', 'masks', 'warnings', 'mapping'])
    expect(result.summary.pullCount).toBe(6)
  }, 30_000)

  it('prints a readable table and honours --mapping and --ambient', () => {
    const mapping = join(dir, 'mapping.json')
    writeFileSync(mapping, JSON.stringify({ ambientTemp: null }))
    const out = run(good, '--mapping', mapping, '--ambient', '33')
    expect(out.status).toBe(0)
    expect(out.stdout).toMatch(/Pulls: 6/)
    expect(out.stdout).toMatch(/ambient 33\.0 °C \(entered\)/)
  }, 30_000)

  it('exits non-zero with the message on a bad file', () => {
    const bad = join(dir, 'bad.csv')
    writeFileSync(bad, 'Time (s),Engine speed (rpm)\n0,1000\n')
    const out = run(bad)
    expect(out.status).not.toBe(0)
    expect(out.stderr).toMatch(/charge-air .*temperature column/)
  }, 30_000)

  it('lists the drives of a joined file and analyses the one chosen with --drive N', () => {
    const first = generateDemoLog('stock-core-hot-day').csv.trimEnd().split('\n')
    const second = generateDemoLog('front-mount-after').csv.trimEnd().split('\n')
    const joined = join(dir, 'joined.csv')
    writeFileSync(joined, [...first, ...second.slice(1)].join('\n') + '\n')
    const refused = run(joined)
    expect(refused.status).toBe(1)
    expect(refused.stderr).toMatch(/holds 2 drives joined together/)
    expect(refused.stderr).toMatch(/ {2}1\. starts at 0\.0 s .* 3900 rows: road speed up to/)
    expect(refused.stderr).toMatch(/Choose one with --drive N/)
    const chosen = run(joined, '--drive', '2')
    expect(chosen.status).toBe(0)
    expect(chosen.stdout).toMatch(/drive 2 of 2/)
    expect(chosen.stdout).toMatch(/Full-load rule \(automatic\): Accelerator pedal at ≥ 90\.0 %/)
    expect(run(joined, '--drive', '3').stderr).toMatch(/no drive 3/)
  }, 60_000)
})
