import type { BaselineInput, BikeRequest, StaffRole } from '@loamline/shared-types';
import type { NewShop } from '../../shops/shops.service';

/**
 * The demo scenario: two invented shops in two time zones, an owner and a technician
 * each, and two riders with a bike and a saved baseline sheet each. Every name, town, address and
 * number here is invented for the demo; addresses are on the reserved `example.test` domain.
 */
export interface DemoStaff {
  role: StaffRole;
  email: string;
  name: string;
}

export interface DemoShop {
  shop: NewShop;
  staff: DemoStaff[];
}

export interface DemoRider {
  email: string;
  name: string;
  /** the shop the rider lives near (for the printed list only) */
  near: string;
  bike: BikeRequest;
  sheet: { name: string; input: BaselineInput };
}

export const DEMO_SHOPS: DemoShop[] = [
  {
    shop: {
      slug: 'kettle-ridge-suspension-lab',
      name: 'Kettle Ridge Suspension Lab',
      town: 'Alder Falls',
      timeZone: 'America/Denver',
      currency: 'USD',
    },
    staff: [
      { role: 'owner', email: 'owner@kettle-ridge.example.test', name: 'Maren' },
      { role: 'technician', email: 'tech@kettle-ridge.example.test', name: 'Tobin' },
    ],
  },
  {
    shop: {
      slug: 'mossgrund-federwerk',
      name: 'Mossgrund Federwerk',
      town: 'Mossgrund',
      timeZone: 'Europe/Berlin',
      currency: 'EUR',
    },
    staff: [
      { role: 'owner', email: 'owner@mossgrund.example.test', name: 'Hanne' },
      { role: 'technician', email: 'tech@mossgrund.example.test', name: 'Lio' },
    ],
  },
];

const enduroBike: BikeRequest = {
  name: '160 mm enduro bike',
  fork: { travelMm: 160, stanchionMm: 36, spring: 'air', spacers: 1, endStroke: { pressurePsi: 180 } },
  shock: { strokeMm: 65, wheelTravelMm: 165, spring: 'air', spacers: 0, maxPressurePsi: 350 },
};

const trailBike: BikeRequest = {
  name: '130 mm trail bike',
  fork: { travelMm: 130, stanchionMm: 34, spring: 'air', spacers: 0, maxPressurePsi: 120 },
  shock: { strokeMm: 50, wheelTravelMm: 130, spring: 'air', spacers: 1 },
};

export const DEMO_RIDERS: DemoRider[] = [
  {
    email: 'rider.alder@example.test',
    name: 'Juna',
    near: 'Kettle Ridge Suspension Lab',
    bike: enduroBike,
    sheet: {
      name: 'Enduro bike, 82 kg',
      input: {
        rider: { massKg: 82 },
        riding: { style: 'enduro', feel: 'balanced' },
        conditions: { altitudeM: 1600, temperatureC: 18 },
        fork: enduroBike.fork!,
        shock: enduroBike.shock!,
      },
    },
  },
  {
    email: 'rider.mossgrund@example.test',
    name: 'Pim',
    near: 'Mossgrund Federwerk',
    bike: trailBike,
    sheet: {
      name: 'Trail bike, 70 kg',
      input: {
        rider: { massKg: 70 },
        riding: { style: 'trail', feel: 'supple' },
        fork: trailBike.fork!,
        shock: trailBike.shock!,
      },
    },
  },
];
