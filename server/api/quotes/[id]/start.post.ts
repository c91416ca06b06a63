export default defineQuoteMove('start')
