import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs'

// Read a PDF back the way a viewer would (pdf.js, its Node build) and return the text of every page.
export async function pdfText(bytes: Uint8Array) {
  const pdf = await getDocument({ data: bytes, useSystemFonts: false, isEvalSupported: false }).promise
  const pages: string[] = []
  for (let n = 1; n <= pdf.numPages; n++) {
    const content = await (await pdf.getPage(n)).getTextContent()
    pages.push(content.items.map(item => ('str' in item ? item.str : '')).join(' '))
  }
  await pdf.destroy()
  return pages.join('\n')
}
