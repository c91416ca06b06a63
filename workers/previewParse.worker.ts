// Parses the first rows of a log for the preview, off the main thread so a phone stays responsive.
// The server re-parses the whole file with the engine; this is only what the person sees first.
import Papa from 'papaparse'

export interface PreviewRequest {
  text: string
  rows: number
}

export interface PreviewResponse {
  rows: string[][]
  delimiter: string
  error?: string
}

self.onmessage = (event: MessageEvent<PreviewRequest>) => {
  const { text, rows } = event.data
  try {
    const result = Papa.parse<string[]>(text, { preview: rows, skipEmptyLines: 'greedy' })
    const reply: PreviewResponse = {
      rows: result.data.map(row => row.map(cell => String(cell).trim())),
      delimiter: result.meta.delimiter,
    }
    self.postMessage(reply)
  }
  catch (error) {
    self.postMessage({ rows: [], delimiter: ',', error: (error as Error).message } satisfies PreviewResponse)
  }
}
