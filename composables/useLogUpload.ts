import type { DriveInfo } from '#shared/types/report'
import type { LogDetail } from './useLogs'

/** What the server answers: the log, or with a drive choice the ids of one log per drive. */
export type UploadResult = LogDetail | { ids: number[] }

export type UploadPhase = 'idle' | 'uploading' | 'analysing' | 'done' | 'failed'

// The upload goes through XMLHttpRequest because fetch cannot report upload progress. Once the
// last byte is sent the server parses and analyses the file: that is the "analysing" phase.
export function useLogUpload() {
  const phase = ref<UploadPhase>('idle')
  const progress = ref(0)
  const error = ref('')
  /** The file holds several drives: the server listed them for the person to choose from. */
  const drives = ref<DriveInfo[] | null>(null)

  function send(form: FormData): Promise<UploadResult | null> {
    phase.value = 'uploading'
    progress.value = 0
    error.value = ''
    return new Promise((resolve) => {
      const xhr = new XMLHttpRequest()
      xhr.open('POST', '/api/logs')
      xhr.responseType = 'json'
      xhr.setRequestHeader('Accept', 'application/json')
      xhr.upload.onprogress = (event) => {
        if (event.lengthComputable) progress.value = Math.min(1, event.loaded / event.total)
      }
      xhr.upload.onload = () => {
        progress.value = 1
        phase.value = 'analysing'
      }
      xhr.onload = () => {
        const body = xhr.response as (UploadResult & { message?: string, data?: { code?: string, drives?: DriveInfo[] } }) | null
        if (xhr.status === 201 || xhr.status === 200) {
          phase.value = 'done'
          resolve(body)
          return
        }
        if (xhr.status === 422 && body?.data?.code === 'SEVERAL_DRIVES' && body.data.drives) {
          drives.value = body.data.drives
          phase.value = 'idle'
          resolve(null)
          return
        }
        phase.value = 'failed'
        error.value = body?.message || uploadStatusMessage(xhr.status)
        resolve(null)
      }
      xhr.onerror = () => {
        phase.value = 'failed'
        error.value = 'The upload was interrupted. Check your connection and try again.'
        resolve(null)
      }
      xhr.send(form)
    })
  }

  return { phase, progress, error, drives, send }
}
