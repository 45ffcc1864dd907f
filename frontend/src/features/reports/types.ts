import type { SpringFit } from '@loamline/shared-types';

/**
 * A fit as the fit routes answer it (`POST …/fits` → `SpringFit & { id, stored, rejected }`). The
 * report's `fits` (shared-types `ServiceReport.fits`) carry no `id` in the contract yet; the panel
 * reads one when the server sends it and otherwise offers a new fit rather than guessing.
 */
export type FitResult = SpringFit & { id?: string; stored: boolean; rejected: boolean };

export type Part = 'fork' | 'shock';
export const PARTS: readonly Part[] = ['fork', 'shock'];
export const partName = (p: Part): string => (p === 'fork' ? 'Fork' : 'Rear shock');
