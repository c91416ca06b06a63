import { and, eq, ne } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { z } from 'zod'
import type { Actor } from '#shared/utils/abilities'
import {
  CORE_BOUNDS,
  CORE_CONSTRUCTIONS,
  CORE_KINDS,
  CORE_PAGE_SIZES,
  CORE_SORT_KEYS,
  END_TANK_LAYOUTS,
  FIN_DENSITY_BOUNDS,
  FIN_DENSITY_UNITS,
  MAX_CORE_PRICE,
  type Bound,
} from '#shared/utils/cores'

type CoreRow = typeof tables.cores.$inferSelect

const bounded = (bound: Bound, integer: boolean) => {
  const base = z.number({ message: `enter ${bound.label.toLowerCase()} as a number in ${bound.unit}` })
  const checked = (integer ? base.int(`${bound.label.toLowerCase()} is a whole number of ${bound.unit}`) : base)
  return checked.min(bound.min, `${bound.label.toLowerCase()} must be between ${bound.min} and ${bound.max} ${bound.unit}`)
    .max(bound.max, `${bound.label.toLowerCase()} must be between ${bound.min} and ${bound.max} ${bound.unit}`)
}

// Money arrives in integer minor units; the page turns "640.50" into 64050 and refuses a third decimal.
const cents = (label: string) => z.number({ message: `enter the ${label} as a whole number of cents` })
  .int(`the ${label} cannot have a fraction of a cent`)
  .min(0, `the ${label} cannot be negative`)
  .max(MAX_CORE_PRICE * 100, `the ${label} is at most ${MAX_CORE_PRICE.toLocaleString('en-GB')}`)

// No .default() anywhere: the same object, made partial, is the PATCH body, and a PATCH writes only
// the keys it was sent. Defaults for a new core are filled in by the POST route.
export const coreFields = z.object({
  name: z.string({ message: 'give the core a name' }).trim().min(2, 'give the core a name of at least 2 characters').max(80, 'keep the name under 80 characters'),
  kind: z.enum(CORE_KINDS, { message: `the kind is one of: ${CORE_KINDS.join(', ')}` }),
  construction: z.enum(CORE_CONSTRUCTIONS, { message: 'the construction is bar-and-plate or tube-and-fin' }).nullable(),
  faceWidthMm: bounded(CORE_BOUNDS.faceWidthMm, true),
  faceHeightMm: bounded(CORE_BOUNDS.faceHeightMm, true),
  depthMm: bounded(CORE_BOUNDS.depthMm, true),
  finDensity: z.number({ message: 'enter the fin density as a number' }).positive('the fin density must be above 0').nullable(),
  finDensityUnit: z.enum(FIN_DENSITY_UNITS, { message: 'say whether fins are counted per inch or per 10 cm' }).nullable(),
  inletDiameterMm: bounded(CORE_BOUNDS.inletDiameterMm, true).nullable(),
  outletDiameterMm: bounded(CORE_BOUNDS.outletDiameterMm, true).nullable(),
  endTankLayout: z.enum(END_TANK_LAYOUTS, { message: 'the end tanks are on the same side or on opposite sides' }).nullable(),
  weightKg: bounded(CORE_BOUNDS.weightKg, false).nullable(),
  uaWPerK: bounded(CORE_BOUNDS.uaWPerK, false).nullable(),
  costCents: cents('cost').nullable(),
  priceCents: cents('sell price').nullable(),
  notes: z.string().max(2000, 'keep the notes under 2000 characters'),
})

export type CoreFields = z.infer<typeof coreFields>

export const newCoreBody = coreFields.partial({
  construction: true,
  finDensity: true,
  finDensityUnit: true,
  inletDiameterMm: true,
  outletDiameterMm: true,
  endTankLayout: true,
  weightKg: true,
  uaWPerK: true,
  costCents: true,
  priceCents: true,
  notes: true,
}).strict()

export const corePatchBody = coreFields.partial().strict()

const FIELD_LABELS: Record<string, string> = {
  name: 'Name', kind: 'Kind', construction: 'Construction', faceWidthMm: 'Face width', faceHeightMm: 'Face height',
  depthMm: 'Depth', finDensity: 'Fin density', finDensityUnit: 'Fin count unit', inletDiameterMm: 'Inlet diameter',
  outletDiameterMm: 'Outlet diameter', endTankLayout: 'End tanks', weightKg: 'Weight', uaWPerK: 'Heat conductance (UA)',
  costCents: 'Cost', priceCents: 'Sell price', notes: 'Notes',
}

// Messages a person reads name the form's labels, never the JSON keys.
export async function readLabelledBody<S extends z.ZodType>(event: H3Event, schema: S, labels: Record<string, string>, what: string): Promise<z.infer<S>> {
  let body: unknown
  try {
    body = await readBody(event)
  }
  catch {
    badRequest('The form did not arrive in a shape the server can read. Reload the page and try again.')
  }
  const result = schema.safeParse(body ?? {})
  if (!result.success) {
    const text = result.error.issues.map((issue) => {
      if (issue.code === 'unrecognized_keys') return `unknown field(s) ${issue.keys.join(', ')}`
      const label = labels[issue.path.join('.')] ?? labels[String(issue.path[0])]
      return label ? `${label}: ${issue.message}` : issue.message
    }).join('; ')
    badRequest(`The ${what} is not valid — ${text}. Correct it and try again.`, { issues: result.error.issues })
  }
  return result.data
}

export function readCoreBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.infer<S>> {
  return readLabelledBody(event, schema, FIELD_LABELS, 'core')
}

// Fin density and its unit are checked together, on the row as it will be after the write.
export function assertFinDensity(row: Pick<CoreFields, 'finDensity' | 'finDensityUnit'>) {
  if (row.finDensity == null) return
  if (row.finDensityUnit == null) badRequest('Fin density: say whether the fins are counted per inch or per 10 cm.')
  const bound = FIN_DENSITY_BOUNDS[row.finDensityUnit]
  if (row.finDensity < bound.min || row.finDensity > bound.max) {
    badRequest(`Fin density: must be between ${bound.min} and ${bound.max} ${bound.unit}. Count the fins over one ${row.finDensityUnit === 'per-inch' ? 'inch' : '10 cm'} of the core face.`)
  }
}

// The unique index would throw a 500; say it first, in words.
export function assertNameFree(tx: Pick<Db, 'select'>, actor: Actor, name: string, exceptId?: number) {
  const where = [eq(tables.cores.workshopId, actor.workshopId), eq(tables.cores.name, name)]
  if (exceptId !== undefined) where.push(ne(tables.cores.id, exceptId))
  const clash = tx.select({ id: tables.cores.id }).from(tables.cores).where(and(...where)).get()
  if (clash) throw createError({ statusCode: 409, message: `The catalogue already has a core called "${name}". Give this one another name, or edit the existing core.` })
}

export function findCore(actor: Actor, id: number): CoreRow {
  const core = useDb().select().from(tables.cores).where(and(eq(tables.cores.id, id), eq(tables.cores.workshopId, actor.workshopId))).get()
  if (!core) notFound('Core')
  return core
}

export const coreListQuery = z.object({
  q: z.string().trim().max(80, 'keep the search under 80 characters').optional(),
  sort: z.enum(CORE_SORT_KEYS, { message: `sort by one of: ${CORE_SORT_KEYS.join(', ')}` }).default('name'),
  dir: z.enum(['asc', 'desc'], { message: 'the order is asc or desc' }).default('asc'),
  status: z.enum(['active', 'retired', 'all'], { message: 'show active, retired or all cores' }).default('active'),
  page: z.coerce.number().int().min(1, 'pages start at 1').max(10_000).optional(),
  pageSize: z.coerce.number().int().refine(n => (CORE_PAGE_SIZES as readonly number[]).includes(n), `a page holds ${CORE_PAGE_SIZES.join(', ')} cores`).default(25),
})

export function coreView(core: CoreRow) {
  return { ...core, retired: core.retiredAt !== null }
}
