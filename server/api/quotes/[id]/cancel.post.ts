export default defineQuoteMove('cancel')
