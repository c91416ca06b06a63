import PDFDocument from 'pdfkit'
import { formatDate, formatMoney } from '#shared/utils/format'
import { QUOTE_CAUTIONS } from '#shared/utils/quotes'
import type { QuoteRow } from './quotes'

export interface QuotePdfInput {
  workshopName: string
  currency: string
  number: string
  revision: number
  issuedOn: string
  validUntil: string | null
  customerName: string
  customerEmail: string
  carDescription: string
  registration: string
  lines: Array<{ description: string, quantity: number, unitPriceCents: number, amountCents: number }>
  subtotalCents: number
  taxRatePct: number
  taxCents: number
  totalCents: number
  depositPct: number
  depositCents: number
  terms: string
  sizingNote: string | null
}

// The shipped font is its Latin subset (Latin-1, general punctuation, the euro sign…); a character
// it lacks is printed without its accent, or as "?", rather than as an empty box.
const EXTRA = new Set([0x131, 0x152, 0x153, 0x2BB, 0x2BC, 0x2C6, 0x2DA, 0x2DC, 0x20AC, 0x2122, 0x2212])
function inFont(ch: string) {
  const c = ch.codePointAt(0) ?? 0
  return c <= 0xFF || (c >= 0x2000 && c <= 0x206F) || EXTRA.has(c)
}
export function printable(text: string) {
  return Array.from(text).map((ch) => {
    if (inFont(ch)) return ch
    const bare = ch.normalize('NFKD').replace(/\p{M}/gu, '')
    return bare && Array.from(bare).every(inFont) ? bare : '?'
  }).join('')
}

const PAGE = { width: 595.28, height: 841.89, margin: 50 }
const INK = '#1d2430'
const SOFT = '#5b6474'
const LINE = '#d9d4c8'
const ACCENT = '#1f5f8b'

// Render the quote to PDF bytes with the app's own font (passed in, so nothing is fetched and no
// built-in PDF font has to be found on disk).
export function renderQuotePdf(input: QuotePdfInput, fontBytes: Uint8Array): Promise<Buffer> {
  // font: '' → pdfkit loads no standard font at all; only the shipped Roboto Flex is embedded.
  const doc = new PDFDocument({ size: 'A4', margin: PAGE.margin, font: '', bufferPages: true, info: { Title: `Quote ${input.number}`, Author: input.workshopName } })
  doc.registerFont('Body', Buffer.from(fontBytes))
  doc.font('Body')
  const chunks: Buffer[] = []
  doc.on('data', (chunk: Buffer) => chunks.push(chunk))
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
  })

  const money = (cents: number) => formatMoney(cents, input.currency)
  const left = PAGE.margin
  const right = PAGE.width - PAGE.margin
  const width = right - left
  const bottom = PAGE.height - PAGE.margin - 30
  const t = (s: string) => printable(s)

  // Header: who quotes, which quote.
  doc.fillColor(ACCENT).fontSize(20).text(t(input.workshopName), left, PAGE.margin, { width: width * 0.6 })
  doc.fillColor(INK).fontSize(16).text(`Quote ${input.number}`, left, PAGE.margin, { width, align: 'right' })
  doc.fillColor(SOFT).fontSize(10)
  const meta = [`Date: ${formatDate(input.issuedOn)}`, `Valid until: ${input.validUntil ? formatDate(input.validUntil) : 'not set'}`]
  if (input.revision > 1) meta.unshift(`Revision ${input.revision}`)
  doc.text(meta.join('\n'), left, PAGE.margin + 22, { width, align: 'right' })

  // Customer and car.
  let y = PAGE.margin + 80
  doc.moveTo(left, y - 10).lineTo(right, y - 10).strokeColor(LINE).lineWidth(1).stroke()
  doc.fillColor(SOFT).fontSize(9).text('FOR', left, y).text('CAR', left + width / 2, y)
  doc.fillColor(INK).fontSize(11)
    .text(t(`${input.customerName}\n${input.customerEmail}`), left, y + 13, { width: width / 2 - 10 })
    .text(t([input.carDescription, input.registration].filter(Boolean).join('\n')), left + width / 2, y + 13, { width: width / 2 })
  y += 60

  // Lines.
  const col = { desc: left, qty: left + 265, unit: left + 320, amount: left + 405 }
  const colW = { desc: 255, qty: 50, unit: 80, amount: width - 405 }
  const header = () => {
    doc.fillColor(SOFT).fontSize(9)
    doc.text('DESCRIPTION', col.desc, y, { width: colW.desc })
    doc.text('QTY', col.qty, y, { width: colW.qty, align: 'right' })
    doc.text('UNIT PRICE', col.unit, y, { width: colW.unit, align: 'right' })
    doc.text('AMOUNT', col.amount, y, { width: colW.amount, align: 'right' })
    y += 14
    doc.moveTo(left, y).lineTo(right, y).strokeColor(LINE).stroke()
    y += 6
  }
  header()
  doc.fontSize(10.5)
  for (const line of input.lines) {
    const description = t(line.description)
    const height = Math.max(doc.heightOfString(description, { width: colW.desc }), 13)
    if (y + height > bottom) {
      doc.addPage()
      y = PAGE.margin
      header()
      doc.fontSize(10.5)
    }
    doc.fillColor(INK)
    doc.text(description, col.desc, y, { width: colW.desc })
    doc.text(String(line.quantity), col.qty, y, { width: colW.qty, align: 'right' })
    doc.text(money(line.unitPriceCents), col.unit, y, { width: colW.unit, align: 'right' })
    doc.text(money(line.amountCents), col.amount, y, { width: colW.amount, align: 'right' })
    y += height + 6
  }
  doc.moveTo(left, y).lineTo(right, y).strokeColor(LINE).stroke()
  y += 8

  // Totals, right-aligned.
  const totals: Array<[string, string, number]> = [
    ['Subtotal', money(input.subtotalCents), 10.5],
    [`Tax (${input.taxRatePct} %)`, money(input.taxCents), 10.5],
    ['Total', money(input.totalCents), 14],
    [`Deposit to book the work (${input.depositPct} %)`, money(input.depositCents), 10.5],
    ['Balance on completion', money(input.totalCents - input.depositCents), 10.5],
  ]
  if (y + 100 > bottom) {
    doc.addPage()
    y = PAGE.margin
  }
  for (const [label, value, size] of totals) {
    doc.fillColor(size > 11 ? INK : SOFT).fontSize(size)
    doc.text(label, left + width * 0.35, y, { width: width * 0.4, align: 'right' })
    doc.fillColor(INK).text(value, left + width * 0.75, y, { width: width * 0.25, align: 'right' })
    y += size + 8
  }
  y += 10

  const section = (title: string, body: string) => {
    doc.fontSize(10)
    const height = doc.heightOfString(body, { width }) + 18
    if (y + height > bottom) {
      doc.addPage()
      y = PAGE.margin
    }
    doc.fillColor(ACCENT).fontSize(11).text(title, left, y, { width })
    doc.fillColor(INK).fontSize(10).text(body, left, y + 15, { width })
    y = doc.y + 14
  }
  if (input.sizingNote) section('Why this core', t(input.sizingNote))
  section('Validity and terms', t([
    input.validUntil ? `This quote is valid until ${formatDate(input.validUntil)}. Prices in ${input.currency}, tax included in the total as shown.` : `Prices in ${input.currency}.`,
    input.terms,
  ].filter(Boolean).join('\n\n')))
  section('Safety', QUOTE_CAUTIONS.map(c => `•  ${c}`).join('\n'))

  // Footer on every page.
  const range = doc.bufferedPageRange()
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i)
    doc.fillColor(SOFT).fontSize(8.5).text(
      t(`${input.workshopName} · Quote ${input.number} · page ${i + 1} of ${range.count}`),
      left, PAGE.height - PAGE.margin - 16, { width, align: 'center', lineBreak: false },
    )
  }
  doc.end()
  return done
}

// The shipped font, bundled into the server as an asset (see nitro.serverAssets in nuxt.config.ts).
export async function quoteFontBytes(): Promise<Uint8Array> {
  const bytes = await useStorage('assets:fonts').getItemRaw<Uint8Array>('roboto-flex-latin-400-normal.woff')
  if (!bytes) throw new Error('The quote font is missing from the server assets.')
  return bytes
}

// Everything the PDF shows, read from the database for one quote.
export async function quotePdfFor(quote: QuoteRow) {
  const detail = quoteDetail(quote)
  const input: QuotePdfInput = {
    workshopName: detail.workshop.name,
    currency: quote.currency,
    number: quote.number,
    revision: quote.revision,
    issuedOn: (quote.sentAt ?? quote.updatedAt ?? quote.createdAt).toISOString().slice(0, 10),
    validUntil: quote.validUntil,
    customerName: detail.customer.name,
    customerEmail: detail.customer.email,
    carDescription: detail.vehicle.description,
    registration: detail.vehicle.registration,
    lines: detail.lines,
    subtotalCents: quote.subtotalCents,
    taxRatePct: quote.taxRatePct,
    taxCents: quote.taxCents,
    totalCents: quote.totalCents,
    depositPct: quote.depositPct,
    depositCents: quote.depositCents,
    terms: quote.terms,
    sizingNote: sizingNote(quote.sizing, quote.coreId, detail.core?.name ?? null),
  }
  return { bytes: await renderQuotePdf(input, await quoteFontBytes()), filename: `${quote.number}.pdf` }
}

interface SizingCandidate { coreId?: number, predictedEffectiveness?: number, chargeTempC?: number, powerRecoveredPct?: number, pressureDropChangeKpa?: number }

// One sentence from the saved sizing for the quoted core, when there is one. It is written for the
// customer: what this core would do on the design day, not its rank among cores they never saw.
export function sizingNote(sizing: Record<string, unknown> | null, coreId: number | null, coreName: string | null) {
  const result = sizing?.result as { candidates?: SizingCandidate[] } | undefined
  const design = sizing?.design as { ambientC?: number } | undefined
  const candidate = result?.candidates?.find(c => c.coreId === coreId)
  if (!candidate) return null
  const parts = [
    candidate.predictedEffectiveness != null ? `predicted effectiveness ${Math.round(candidate.predictedEffectiveness * 100)} %` : null,
    candidate.chargeTempC != null ? `charge temperature about ${candidate.chargeTempC.toFixed(0)} °C${design?.ambientC != null ? ` on a ${design.ambientC} °C day` : ''}` : null,
    candidate.powerRecoveredPct != null ? `about ${candidate.powerRecoveredPct.toFixed(1)} % of power recovered` : null,
    candidate.pressureDropChangeKpa != null && Math.abs(candidate.pressureDropChangeKpa) >= 0.5
      ? `${Math.abs(candidate.pressureDropChangeKpa).toFixed(1)} kPa ${candidate.pressureDropChangeKpa < 0 ? 'less' : 'more'} boost lost across the core`
      : null,
  ].filter(Boolean)
  return `${coreName ?? 'The quoted core'}: ${parts.join(', ')}, against the core fitted when the log was made. An estimate from this car's own log, to be confirmed by a log after fitting.`
}
