import type { VehicleDraft } from '~/components/vehicle/VehicleForm.vue'

export function emptyVehicleDraft(): VehicleDraft {
  return { description: '', registration: '', displacementL: null, cylinders: 4, fuel: 'diesel', ratedPowerKw: null, fittedCoreId: null, ownerId: null, notes: '' }
}

// The API wants absent optional numbers as null and no ownerId when the person cannot choose one.
export function vehicleDraftToBody(draft: VehicleDraft, withOwner: boolean) {
  const { ownerId, ratedPowerKw, ...rest } = draft
  return {
    ...rest,
    ratedPowerKw: typeof ratedPowerKw === 'number' && Number.isFinite(ratedPowerKw) ? ratedPowerKw : null,
    ...(withOwner && ownerId ? { ownerId } : {}),
  }
}
