import { createHash } from 'node:crypto'

// Content security policy for pages: scripts from this site only, plus the inline scripts Nuxt
// writes into each page (its config and payload), allowed one by one by their SHA-256. Styles may
// be inline (Vue style bindings, the chart library); nothing may frame the app.
const PAGE_POLICY = [
  'default-src \'self\'',
  'img-src \'self\' data: blob:',
  'font-src \'self\' data:',
  'style-src \'self\' \'unsafe-inline\'',
  'connect-src \'self\'',
  'worker-src \'self\' blob:',
  'object-src \'none\'',
  'base-uri \'self\'',
  'form-action \'self\'',
  'frame-ancestors \'none\'',
]

export const BASE_PAGE_POLICY = [...PAGE_POLICY, 'script-src \'self\''].join('; ')
export const API_POLICY = 'default-src \'none\'; frame-ancestors \'none\''

const SCRIPT = /<script\b([^>]*)>([\s\S]*?)<\/script>/gi
const NOT_JAVASCRIPT = /\btype\s*=\s*["']?(?!module\b|text\/javascript\b|application\/javascript\b)[\w/+.-]+/i

// The hashes of a page's inline scripts (external ones are covered by 'self'; data blocks such as
// type="application/json" are not run, so need none).
export function inlineScriptHashes(html: string) {
  const hashes = new Set<string>()
  for (const [, attributes = '', content = ''] of html.matchAll(SCRIPT)) {
    if (/\bsrc\s*=/i.test(attributes) || NOT_JAVASCRIPT.test(attributes) || !content) continue
    hashes.add(`'sha256-${createHash('sha256').update(content, 'utf8').digest('base64')}'`)
  }
  return [...hashes]
}

export function pagePolicy(html: string) {
  return [...PAGE_POLICY, ['script-src \'self\'', ...inlineScriptHashes(html)].join(' ')].join('; ')
}
