import { z } from 'zod'

export const whatIfQuery = z.object({
  ambientC: z.coerce.number({ message: 'give the ambient temperature in °C' }).min(-30, 'give an ambient temperature between −30 and 55 °C').max(55, 'give an ambient temperature between −30 and 55 °C'),
})
