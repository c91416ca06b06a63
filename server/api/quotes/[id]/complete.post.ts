export default defineQuoteMove('complete')
