// The currencies a workshop can price in, declared once for the setup, the workshop settings and the API.
export const CURRENCIES = ['EUR', 'GBP', 'USD', 'CHF', 'SEK', 'NOK', 'DKK', 'PLN', 'CZK', 'AUD', 'NZD', 'CAD'] as const
export type Currency = typeof CURRENCIES[number]
