import { z } from 'zod'

export const whatIfQuery = z.object({
  ambientC: z.coerce.number({ message: 'ambientC: give the ambient temperature in °C' }).min(-30, 'ambientC is between −30 and 55 °C').max(55, 'ambientC is between −30 and 55 °C'),
})
