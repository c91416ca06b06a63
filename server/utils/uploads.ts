import { createReadStream } from 'node:fs'
import { mkdir, readFile, rename } from 'node:fs/promises'
import { dirname, join } from 'node:path'
import type { Readable } from 'node:stream'
import { builtinDrivers, type Driver } from 'unstorage'
import fsDriver from 'unstorage/drivers/fs'

// Uploaded log files live in one Nitro storage mount, `uploads`, under the key `logs:<log id>`
// (never the name the user gave them). nuxt.config.ts declares the default (the fs driver at
// ./data/uploads); at start-up it is mounted again from runtime config, so a deployment chooses
// another driver by configuration alone: NUXT_UPLOADS_DRIVER (an unstorage driver name, e.g. s3)
// and NUXT_UPLOADS_OPTIONS (its options as JSON). See README, "Where uploads are kept".
//
// Large files are not carried through memory when they need not be: with the fs driver the worker
// reads a stored file at its path and a new file is renamed into place. Any other driver gets
// the file's bytes once (setItemRaw) and gives them back once (getItemRaw) for the worker.

const MOUNT = 'uploads'
const logKey = (logId: number) => `logs:${logId}`

/** The engine's view of a stored file: its path on this machine's disk, or its bytes. */
export type StoredLogSource = { path: string } | Uint8Array

interface Mounted {
  /** The fs driver's folder; undefined for any other driver. */
  localBase?: string
}

let mounting: Promise<Mounted> | undefined

/** Mount the uploads storage from runtime config, once; every use of the files waits for it. */
export function mountUploads(): Promise<Mounted> {
  mounting ??= (async () => {
    const { driver, options } = useRuntimeConfig().uploads
    const name = String(driver || 'fs')
    const storage = useStorage()
    const local = name === 'fs'
    const mounted = local ? fsDriver({ base: uploadsDir() }) : await loadDriver(name, options)
    await storage.unmount(MOUNT, true)
    storage.mount(MOUNT, mounted)
    return local ? { localBase: uploadsDir() } : {}
  })()
  return mounting
}

// Only the fs driver is bundled. Another driver and the package it needs (aws4fetch for s3) are
// loaded from node_modules when configured, so an unused driver costs nothing.
async function loadDriver(name: string, options: unknown): Promise<Driver> {
  const specifier = (builtinDrivers as Record<string, string>)[name]
  if (!specifier) throw new Error(`NUXT_UPLOADS_DRIVER="${name}" is not an unstorage driver. Use fs, s3 or another name from unstorage's list.`)
  try {
    const module = await import(/* @vite-ignore */ specifier) as { default: (options: unknown) => Driver }
    // A copy: runtime config is read-only, and some drivers fill in their options.
    return module.default(typeof options === 'object' && options ? { ...options } : {})
  }
  catch (error) {
    throw new Error(`The uploads storage driver "${name}" could not be started (${(error as Error).message}). Check NUXT_UPLOADS_OPTIONS, and install the package the driver needs (for s3: aws4fetch), then start again.`, { cause: error })
  }
}

const uploads = () => useStorage(MOUNT)

function localPath(mounted: Mounted, logId: number) {
  return mounted.localBase ? join(mounted.localBase, 'logs', String(logId)) : undefined
}

// A storage that does not answer or refuses the key (a bucket gone, a secret rotated at the
// provider) is a 503 that says so, not a 500: the log is intact, its file is out of reach for now.
async function reading<T>(logId: number, read: () => Promise<T>): Promise<T> {
  try {
    return await read()
  }
  catch (error) {
    console.error(`[uploads] The file of log ${logId} could not be read (${(error as Error).message}).`)
    throw createError({ statusCode: 503, message: 'The log\'s file could not be read from the file storage just now. Nothing was changed; try again in a minute, and tell the workshop owner if it keeps happening.' })
  }
}

/** Whether the log's file is stored. */
export function hasLogFile(logId: number): Promise<boolean> {
  return reading(logId, async () => {
    await mountUploads()
    return uploads().hasItem(logKey(logId))
  })
}

/** The log's stored file for the engine, or null when it is not stored. */
export function storedLogSource(logId: number): Promise<StoredLogSource | null> {
  return reading(logId, async () => {
    const mounted = await mountUploads()
    const path = localPath(mounted, logId)
    if (path) return (await uploads().hasItem(logKey(logId))) ? { path } : null
    return asBytes(await uploads().getItemRaw(logKey(logId)))
  })
}

/** The log's stored file as a stream for a download, or null when it is not stored. */
export async function storedLogStream(logId: number): Promise<Readable | Uint8Array | null> {
  const source = await storedLogSource(logId)
  return source && 'path' in source ? createReadStream(source.path) : source
}

/**
 * Keep a received file (a temporary file on this disk) as the log's file. With the fs driver the
 * file is renamed into place, so a half-copied file never stands under a log's key; any other
 * driver is given the bytes in one put.
 */
export async function keepLogFile(logId: number, temporaryPath: string): Promise<void> {
  const mounted = await mountUploads()
  const path = localPath(mounted, logId)
  if (path) {
    await mkdir(dirname(path), { recursive: true })
    await rename(temporaryPath, path)
    return
  }
  await uploads().setItemRaw(logKey(logId), await readFile(temporaryPath))
}

/** Remove a log's file. The row is gone by then, so a failure is logged, not answered. */
export async function removeLogFile(logId: number): Promise<void> {
  try {
    await mountUploads()
    await uploads().removeItem(logKey(logId))
  }
  catch (error) {
    console.error(`[uploads] The file of deleted log ${logId} could not be removed (${(error as Error).message}); remove "${logKey(logId)}" from the uploads storage by hand.`)
  }
}

function asBytes(raw: unknown): Uint8Array | null {
  if (raw === null || raw === undefined) return null
  if (raw instanceof Uint8Array) return raw
  if (raw instanceof ArrayBuffer) return new Uint8Array(raw)
  if (typeof raw === 'string') return new TextEncoder().encode(raw)
  throw new Error('The uploads storage returned a log file in a form it cannot read.')
}
