export default defineQuoteMove('accept')
