import type { PreviewRequest, PreviewResponse } from '~/workers/previewParse.worker'

/** Bytes read for the preview: plenty for a few dozen rows of a wide log. */
const PREVIEW_BYTES = 64 * 1024

// The first rows of a file, parsed by papaparse in a Web Worker (one worker per file, ended after).
// Decoded with the encoding the server detected (UTF-16, Windows-1252…), as the import reads it.
export async function parsePreview(file: Blob, rows = 20, encoding = 'utf-8'): Promise<PreviewResponse> {
  const text = new TextDecoder(encoding).decode(await file.slice(0, PREVIEW_BYTES).arrayBuffer())
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
