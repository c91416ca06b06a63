// Barrel of the physics half of the analysis engine (framework-free). The import/pull/soak half
// and `index.ts` are maintained separately.
export * from './constants'
export * from '../../shared/quantities/units'
export * from './atmosphere'
export * from './density'
export * from './compressor'
export * from './effectiveness'
export * from './power'
export * from './stats'
export * from './correction'
export * from './entu'
export * from './comparison'
