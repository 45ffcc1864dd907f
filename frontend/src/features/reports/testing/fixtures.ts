import type { Appointment, Attachment, CurveRun, ServiceReport } from '@loamline/shared-types';
import type { FitResult } from '../types';

// Made-up data in the contract's shape (shared-types/src/reports.ts); no real shops or people.

export const run: CurveRun = {
  label: 'End-stroke 190 psi',
  settings: { part: 'fork', mainPsi: 85, endStrokePsi: 190, spacers: 1 },
  units: { travel: 'mm', force: 'N' },
  points: [
    { travelMm: 0, forceN: 180, stroke: 'compression' },
    { travelMm: 40, forceN: 520, stroke: 'compression' },
    { travelMm: 80, forceN: 760, stroke: 'compression' },
    { travelMm: 140, forceN: 2100, stroke: 'compression' },
    { travelMm: 140, forceN: 2010, stroke: 'rebound' },
    { travelMm: 80, forceN: 700, stroke: 'rebound' },
    { travelMm: 0, forceN: 120, stroke: 'rebound' },
  ],
  comparison: {
    sagTravelMm: 40,
    measuredAtSagN: 520,
    modelAtSagN: 500,
    endTravelMm: 135,
    measuredAtEndN: 1900,
    modelAtEndN: 1700,
    frictionBandN: 30,
    bumpStopMm: 138,
    model: [
      { travelMm: 80, compressionN: 740, reboundN: 690 },
      { travelMm: 0, compressionN: 170, reboundN: 130 },
      { travelMm: 140, compressionN: 1800, reboundN: 1750 },
    ],
  },
};

export const curve: Attachment = {
  id: 'att-c1',
  kind: 'curve',
  name: 'fork-190.csv',
  contentType: 'text/csv',
  sizeBytes: 2048,
  createdAt: '2027-06-15T11:00:00+01:00',
  url: '/api/workshop/appointments/a1/attachments/att-c1',
  thumbnailUrl: null,
  run,
};

export const photo: Attachment = {
  id: 'att-p1',
  kind: 'photo',
  name: 'lowers.jpg',
  contentType: 'image/jpeg',
  sizeBytes: 120_000,
  createdAt: '2027-06-15T11:00:00+01:00',
  url: '/api/appointments/a1/attachments/att-p1',
  thumbnailUrl: '/api/appointments/a1/attachments/att-p1/thumbnail',
  run: null,
};

export const goodFit: FitResult = {
  id: 'fit-1',
  createdAt: '2026-12-02T10:00:00.000Z',
  part: 'fork',
  geometry: { positiveLengthMm: 212.4, negativeVolumeCm3: 38.2, endStrokeVolumeCm3: 21.5 },
  frictionN: 28,
  rmsN: 14.2,
  relativeRms: 0.021,
  identified: { positiveLengthMm: true, negativeVolumeCm3: true, endStrokeVolumeCm3: false, frictionN: true },
  quality: 'good',
  reasons: [],
  runIds: ['att-c1'],
  stored: false,
  rejected: false,
};

export const poorFit: FitResult = {
  ...goodFit,
  id: 'fit-2',
  rmsN: 180,
  relativeRms: 0.24,
  quality: 'poor',
  reasons: ['The curve is straight: it looks like a coil spring, not air.'],
};

export const report = (over: Partial<ServiceReport> = {}): ServiceReport => ({
  appointmentId: 'a1',
  version: 0,
  status: 'draft',
  updatedAt: null,
  updatedBy: null,
  completedAt: null,
  checklist: [
    { label: 'Lower legs serviced', done: false },
    { label: 'Air spring serviced', done: false },
  ],
  notes: '',
  fork: null,
  shock: null,
  attachments: [],
  fits: [],
  ...over,
});

export const appointment = (over: Partial<Appointment> = {}): Appointment => ({
  id: 'a1',
  status: 'completed',
  shop: {
    id: 's',
    slug: 'ridge-works',
    name: 'Ridge Works',
    town: 'Hillcombe',
    timeZone: 'Europe/London',
    currency: 'GBP',
  },
  service: {
    id: 'svc-1',
    name: 'Fork air spring service',
    durationMinutes: 60,
    priceMinor: 8900,
    depositMinor: 0,
  },
  start: '2027-06-15T10:00:00+01:00',
  end: '2027-06-15T11:00:00+01:00',
  bench: 1,
  holdExpiresAt: null,
  bike: { id: 'bike-1', name: 'Trail bike', description: '150 mm fork' },
  baselineSheetId: 'sheet-1',
  notes: '',
  proposedStart: null,
  declineReason: null,
  cancelReason: null,
  canCancel: false,
  canMove: false,
  fullRefundIfCancelled: false,
  refundIfCancelledMinor: 0,
  payment: null,
  createdAt: '2027-06-01T10:00:00Z',
  ...over,
});
