import type { VehicleDraft } from '~/components/vehicle/VehicleForm.vue'

export function emptyVehicleDraft(): VehicleDraft {
  return { description: '', registration: '', displacementL: null, cylinders: 4, fuel: 'diesel', ratedPowerKw: null, fittedCoreId: null, ownerId: null, notes: '' }
}

// The API wants absent optional numbers as null, and no ownerId or fitted core from a person who
// cannot choose them (the server refuses a customer's fitted core with a 403).
export function vehicleDraftToBody(draft: VehicleDraft, staff: boolean) {
  const { ownerId, ratedPowerKw, fittedCoreId, ...rest } = draft
  return {
    ...rest,
    ratedPowerKw: typeof ratedPowerKw === 'number' && Number.isFinite(ratedPowerKw) ? ratedPowerKw : null,
    ...(staff ? { fittedCoreId } : {}),
    ...(staff && ownerId ? { ownerId } : {}),
  }
}
