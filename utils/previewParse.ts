import type { PreviewRequest, PreviewResponse } from '~/workers/previewParse.worker'

/** Bytes read for the preview: plenty for a few dozen rows of a wide log. */
const PREVIEW_BYTES = 64 * 1024

// The first rows of a file, parsed by papaparse in a Web Worker (one worker per file, ended after).
export async function parsePreview(file: Blob, rows = 20): Promise<PreviewResponse> {
  const text = await file.slice(0, PREVIEW_BYTES).text()
  // Drop a possibly cut last line.
  const cut = file.size > PREVIEW_BYTES ? text.slice(0, Math.max(0, text.lastIndexOf('\n'))) : text
  const worker = new Worker(new URL('../workers/previewParse.worker.ts', import.meta.url), { type: 'module' })
  try {
    return await new Promise<PreviewResponse>((resolve, reject) => {
      worker.onmessage = (event: MessageEvent<PreviewResponse>) => resolve(event.data)
      worker.onerror = event => reject(new Error(event.message || 'The preview could not be read.'))
      worker.postMessage({ text: cut, rows: rows + 1 } satisfies PreviewRequest)
    })
  }
  finally {
    worker.terminate()
  }
}
