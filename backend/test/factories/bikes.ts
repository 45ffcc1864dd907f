import type { BaselineInput, BikeRequest, ForkInput, ShockInput } from '@loamline/shared-types';

/** Generic bikes for tests (invented specs within the model's ranges; no real product). */
export function enduroBike(): BikeRequest & { fork: ForkInput; shock: ShockInput } {
  return {
    name: '160 mm enduro bike',
    fork: { travelMm: 160, stanchionMm: 36, spring: 'air', spacers: 1, endStroke: { pressurePsi: 180 } },
    shock: { strokeMm: 65, wheelTravelMm: 165, spring: 'air', spacers: 0, maxPressurePsi: 350 },
  };
}

export function hardtail(): BikeRequest & { fork: ForkInput; shock: null } {
  return {
    name: '120 mm hardtail',
    fork: {
      travelMm: 120,
      stanchionMm: 32,
      spring: 'air',
      spacers: 0,
      maxPressurePsi: 120,
      geometry: { pistonDiameterMm: 28, positiveLengthMm: 190, negativeVolumeCm3: 60 },
    },
    shock: null,
  };
}

/** A complete compute input for a rider on the enduro bike. */
export function baselineInput(overrides: Partial<BaselineInput> = {}): BaselineInput {
  const bike = enduroBike();
  return {
    rider: { massKg: 82 },
    riding: { style: 'enduro', feel: 'balanced' },
    fork: bike.fork,
    shock: bike.shock,
    ...overrides,
  };
}
