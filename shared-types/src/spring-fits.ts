import type { SpringFit } from './reports';

/**
 * The bike's measured spring in Workshop (docs/api): `POST /api/workshop/appointments/:id/fits` fits
 * the geometry from the appointment's curve runs, `…/fits/:fitId/store` writes it on the rider's
 * bike (`Bike.fork.measured` / `Bike.shock.measured`), `…/fits/:fitId/reject` sets it aside.
 */

/** `POST /api/workshop/appointments/:id/fits` */
export interface FitRequest {
  part: 'fork' | 'shock';
  /** the curve attachments to fit (default: every curve of that part on the appointment) */
  attachmentIds?: string[];
}

/** `POST /api/workshop/appointments/:id/fits/:fitId/store` */
export interface StoreFitRequest {
  /** a poor fit is stored only with this set */
  confirmPoor?: boolean;
}

/** A fit as the Workshop sees it. */
export type SpringFitView = SpringFit & {
  id: string;
  /** on the bike now (the last stored fit of its appointment and part) */
  stored: boolean;
  rejected: boolean;
  createdAt: string;
};
