// The figures a driver meets in a report, in the words of docs/glossary.md (its meaning column).
// One list serves the "What the numbers mean" page and the short hints beside the figures, so the
// page and the hints cannot drift apart.

export type NumberTermId
  = | 'effectiveness' | 'over-ambient' | 'density-ratio' | 'standard-air' | 'left-out' | 'fit-r2'
    | 'recovery-time' | 'confidence' | 'soak-per-pull' | 'sustained-pull' | 'clipped'

export interface NumberTerm {
  id: NumberTermId
  term: string
  /** One sentence, short enough for a hover hint. */
  short: string
  /** The page's fuller explanation. */
  more: string
}

export const NUMBER_TERMS: readonly NumberTerm[] = [
  {
    id: 'effectiveness',
    term: 'Effectiveness',
    short: 'How much of the heat the turbo added the intercooler removes; 100 % would bring the charge air back to ambient.',
    more: 'Worked out as (pre-cooler temperature − charge temperature) ÷ (pre-cooler temperature − ambient temperature). It is "measured" when the log has a pre-cooler temperature sensor, and "estimated" from boost when it does not — the estimate reads a little low.',
  },
  {
    id: 'over-ambient',
    term: 'Temperature over ambient',
    short: 'Charge temperature minus ambient temperature, in K: how much warmer the air the engine breathes is than the air outside.',
    more: 'The charge temperature is the air after the intercooler, in the intake manifold. The ambient temperature is the outside air where the car was driven. The smaller the difference, the better the intercooler is doing.',
  },
  {
    id: 'density-ratio',
    term: 'Density ratio',
    short: 'Charge-air density ÷ standard-air density: above 1 means the engine is fed denser air than standard air.',
    more: 'Boost packs the air denser; heat thins it out again. Power follows density on an engine limited by its air, so a falling density ratio from one pull to the next is power going away.',
  },
  {
    id: 'standard-air',
    term: 'Standard air (ISA)',
    short: 'The sea-level reference air: 15 °C, 101.325 kPa, 1.225 kg/m³.',
    more: 'The International Standard Atmosphere at sea level. Densities are stated against it so that logs from different days and places can be read on one scale. When a log has no barometric pressure, standard air (or standard air for the altitude given) is assumed.',
  },
  {
    id: 'left-out',
    term: 'Left out',
    short: 'A stretch of the log not used in the figures (engine off, settling after a restart, a sensor fault); the reason is always shown.',
    more: 'Readings that cannot be trusted would bend the figures, so they are set aside rather than deleted: the chart shows them shaded, with the reason beside them.',
  },
  {
    id: 'fit-r2',
    term: 'Fit R²',
    short: 'How well the soak trend line follows the pulls: 1 = perfectly, near 0 = the pulls do not follow a trend.',
    more: 'The soak per pull comes from a straight line through the pulls\' charge temperatures. A low fit R² means the pulls were uneven (different boost, traffic, a long pause), so read the soak per pull with care.',
  },
  {
    id: 'recovery-time',
    term: 'Recovery time',
    short: 'How long the charge temperature takes to come back down once the car is moving again after a soak event.',
    more: 'A soak event is the charge temperature climbing while the car is slow or stopped. A short recovery time means the core sheds its heat quickly once air flows through it again.',
  },
  {
    id: 'confidence',
    term: 'Confidence (%)',
    short: 'How sure Densitas is of what a column in your log means, in %.',
    more: 'When a log is uploaded, each column is matched to a sensor by its name and its values. "Sure" matches need no check; "Likely" and "Unsure" ones are worth a look before the log is analysed.',
  },
  {
    id: 'soak-per-pull',
    term: 'Soak per pull',
    short: 'How much the charge temperature climbs from one pull to the next, in K per pull.',
    more: 'Heat soak is the intercooler core heating up over repeated pulls, so the charge air comes out hotter each time. Near 0 K per pull the core keeps up; a few K per pull means it is filling with heat.',
  },
  {
    id: 'sustained-pull',
    term: 'Sustained pull',
    short: 'A long stretch at high boost that is not a sprint, such as a motorway climb or towing.',
    more: 'A pull is one stretch of full load found in a log. Most are hard accelerations of a few seconds; a sustained pull lasts much longer and loads the intercooler differently, so it is marked apart.',
  },
  {
    id: 'clipped',
    term: 'Clipped',
    short: 'A sensor sitting at the end of its range: the real value was higher than the log shows.',
    more: 'Many sensors stop at a fixed top value. While a reading sits there the real value is unknown, so those stretches are left out or marked.',
  },
]

const byId = new Map(NUMBER_TERMS.map(t => [t.id, t]))

/** The short hint for a term, for a `title` beside the figure. */
export const numberHint = (id: NumberTermId): string => byId.get(id)!.short

/** Where the page explains a term. */
export const numberHelpLink = (id?: NumberTermId): string => (id ? `/help/numbers#${id}` : '/help/numbers')
