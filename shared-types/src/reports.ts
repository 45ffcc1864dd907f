/**
 * Service reports (docs/api): what the technician did and set after the bench work, photos and
 * measured spring curves, the bike's measured spring fitted from them. Pressures are gauge psi,
 * lengths mm, volumes cm³, forces N on the wire; the browser converts at the edge.
 */

/** One item of the work done, from the service's checklist (or added by the technician). */
export interface ChecklistItem {
  label: string;
  done: boolean;
}

/** The settings a part was left with, as the technician set and measured them. */
export interface PartSettings {
  /** main chamber, gauge psi (air) */
  mainPsi: number | null;
  /** end-stroke chamber, gauge psi; null without one */
  endStrokePsi: number | null;
  spacers: number | null;
  /** coil rate, lb/in (coil) */
  springRateLbPerIn: number | null;
  /** clicks counted from fully closed (clockwise in) */
  reboundClicks: number | null;
  compressionClicks: number | null;
  /** sag measured on the bike, mm */
  sagMm: number | null;
}

/** `PUT /api/workshop/appointments/:id/report` (staff; a draft until the appointment is completed) */
export interface ServiceReportInput {
  /**
   * the report's `version` the edit started from (0 before the first save): a save over someone
   * else's newer one is refused with 409 instead of overwriting it
   */
  version: number;
  checklist: ChecklistItem[];
  notes: string;
  fork: PartSettings | null;
  shock: PartSettings | null;
}

/** What the server accepts on a report and its uploads (docs/service-reports.md). */
export const REPORT_LIMITS = {
  checklistItems: 40,
  checklistLabelChars: 120,
  notesChars: 4000,
  /** gauge psi, main and end-stroke chamber */
  psi: { min: 0, max: 1000 },
  clicks: { min: 0, max: 60 },
  spacers: { min: 0, max: 10 },
  sagMm: { min: 0, max: 400 },
  springRateLbPerIn: { min: 0, max: 3000 },
  photoMaxBytes: 8 * 1024 * 1024,
  photosPerAppointment: 6,
  photoTypes: ['image/jpeg', 'image/png', 'image/webp'],
  thumbnailPx: 320,
  curveMaxBytes: 1024 * 1024,
  curveLabelChars: 80,
  fileNameChars: 200,
} as const;

export const ATTACHMENT_KINDS = ['photo', 'curve'] as const;
export type AttachmentKind = (typeof ATTACHMENT_KINDS)[number];

/** One point of a measured curve, converted to mm and N. */
export interface MeasuredPoint {
  travelMm: number;
  forceN: number;
  stroke: 'compression' | 'rebound';
}

/** The settings a bench run was made at (what the model is compared with). */
export interface RunSettings {
  part: 'fork' | 'shock';
  mainPsi: number;
  endStrokePsi: number | null;
  spacers: number;
}

/** The technician's reading of one run against the model for its settings. */
export interface RunComparison {
  /** travel at the rider's sag (the report's measured sag, else the model's target) */
  sagTravelMm: number;
  measuredAtSagN: number;
  modelAtSagN: number;
  /** near the end of travel (90 %) */
  endTravelMm: number;
  measuredAtEndN: number;
  modelAtEndN: number;
  /** half the gap between compression and rebound, averaged over mid-travel */
  frictionBandN: number;
  /** where the curve leaves the model near the end of travel (a bump stop); null when it doesn't */
  bumpStopMm: number | null;
  /** the model's curve at the run's travels (compression, rebound), for the chart */
  model: { travelMm: number; compressionN: number; reboundN: number }[];
}

export interface CurveRun {
  label: string;
  settings: RunSettings;
  /** the units the file was in (points are converted) */
  units: { travel: 'mm' | 'in'; force: 'N' | 'lbf' };
  points: MeasuredPoint[];
  comparison: RunComparison | null;
}

export interface Attachment {
  id: string;
  kind: AttachmentKind;
  /** the file's name as uploaded, cleaned for display (never a path) */
  name: string;
  contentType: string;
  sizeBytes: number;
  createdAt: string;
  /** where the browser fetches it (rider and staff routes differ) */
  url: string;
  /** photos: a small JPEG */
  thumbnailUrl: string | null;
  /** curves: the parsed run */
  run: CurveRun | null;
}

/** The geometry fitted from bench curves, and how well. */
export interface SpringFit {
  part: 'fork' | 'shock';
  geometry: { positiveLengthMm: number; negativeVolumeCm3: number; endStrokeVolumeCm3: number | null };
  frictionN: number;
  rmsN: number;
  relativeRms: number;
  /** which parameters the runs could pin down */
  identified: {
    positiveLengthMm: boolean;
    negativeVolumeCm3: boolean;
    endStrokeVolumeCm3: boolean;
    frictionN: boolean;
  };
  quality: 'good' | 'poor';
  reasons: string[];
  /** what the runs could not pin down, and other notes that do not make the fit poor */
  notes?: string[];
  runIds: string[];
}

/** `GET /api/workshop/appointments/:id/report` and, once completed, `GET /api/appointments/:id/report` */
export interface ServiceReport extends ServiceReportInput {
  appointmentId: string;
  /** raised by every save; 0 while nothing was saved (send it back with the next PUT) */
  version: number;
  status: 'draft' | 'final';
  updatedAt: string | null;
  updatedBy: string | null;
  completedAt: string | null;
  attachments: Attachment[];
  /** the last fit of each part, and whether it was stored on the bike */
  fits: (SpringFit & { id: string; createdAt: string; stored: boolean; rejected: boolean })[];
}

/** A bike's measured spring (on `Bike.fork`/`Bike.shock` as `measured`), used by later baselines. */
export interface MeasuredSpring {
  positiveLengthMm: number;
  negativeVolumeCm3: number;
  endStrokeVolumeCm3: number | null;
  frictionN: number;
  /** "measured on 2 December 2026 at <shop>" */
  label: string;
  measuredAt: string;
  shopName: string;
  appointmentId: string;
}
