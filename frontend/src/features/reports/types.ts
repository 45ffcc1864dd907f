import type { SpringFitView } from '@loamline/shared-types';

/** A fit as the fit routes and the report answer it (`SpringFitView` of shared-types). */
export type FitResult = SpringFitView;

export type Part = 'fork' | 'shock';
export const PARTS: readonly Part[] = ['fork', 'shock'];
export const partName = (p: Part): string => (p === 'fork' ? 'Fork' : 'Rear shock');
