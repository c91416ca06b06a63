import { createWriteStream } from 'node:fs'

// An invented 8-channel log for the benchmark and the load test: a pull of 7 s every 60 s on a
// warm day, written as it is generated (a 1 M-row file is about 45 MB).
export const RATE_HZ = 20

export async function writeLog(path: string, rows: number): Promise<void> {
  const out = createWriteStream(path, { highWaterMark: 1 << 20 })
  const header = 'Time (s),Engine speed (rpm),Pedal (%),Manifold pressure abs (kPa),Charge air temp (°C),Pre-cooler temp (°C),Ambient temp (°C),Road speed (km/h)\n'
  out.write(header)
  let seed = 12345
  const noise = () => {
    seed = (seed * 1103515245 + 12345) >>> 0
    return seed / 4294967296 - 0.5
  }
  let chunk = ''
  for (let i = 0; i < rows; i++) {
    const t = i / RATE_HZ
    const inCycle = t % 60
    const pull = inCycle >= 20 && inCycle < 27
    const rpm = pull ? 1800 + 350 * (inCycle - 20) : 2000 + 100 * Math.sin(t / 9)
    const map = pull ? 225 : 110 + 5 * Math.sin(t / 7)
    // Smooth like a real sensor: +1.5 K/s during the pull, exponential recovery after it.
    const charge = pull ? 42 + 1.5 * (inCycle - 20) : 42 + 10.5 * Math.exp(-(inCycle < 20 ? inCycle + 33 : inCycle - 27) / 10)
    chunk += `${t.toFixed(2)},${Math.round(rpm + 10 * noise())},${(pull ? 100 : 24 + 2 * noise()).toFixed(1)},${(map + noise()).toFixed(1)},${(charge + 0.3 * noise()).toFixed(1)},${(pull ? 140 : 60 + noise()).toFixed(1)},${(31 + 0.2 * noise()).toFixed(1)},${(rpm * 0.028).toFixed(1)}\n`
    if (chunk.length > 1 << 16) {
      if (!out.write(chunk)) await new Promise<void>(resolve => out.once('drain', () => resolve()))
      chunk = ''
    }
  }
  out.write(chunk)
  await new Promise<void>((resolve, reject) => out.end((error?: Error | null) => (error ? reject(error) : resolve())))
}
