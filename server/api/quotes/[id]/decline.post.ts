export default defineQuoteMove('decline')
