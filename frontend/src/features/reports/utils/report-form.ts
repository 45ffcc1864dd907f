import {
  BASELINE_LIMITS,
  type ChecklistItem,
  type PartSettings,
  type ServiceReport,
  type ServiceReportInput,
} from '@loamline/shared-types';
import { barToPsi, inToMm, mmToIn, parseDecimal, psiToBar, round, type UnitPrefs } from '@/lib/units';
import type { Part } from '../types';
import { lbPerInToNPerMm, nPerMmToLbPerIn, rateUnit } from './settings-units';

/*
 * The service report form: what the technician types (text, in their units) ⇄ the API's
 * ServiceReportInput (psi, mm, lb/in). Pure functions, tested in report-form.test.ts.
 */

export type SpringKind = 'air' | 'coil';

export interface PartValues {
  spring: SpringKind;
  mainPsi: string;
  endStrokePsi: string;
  spacers: string;
  springRateLbPerIn: string;
  reboundClicks: string;
  compressionClicks: string;
  sagMm: string;
}

export interface ReportFormValues {
  checklist: ChecklistItem[];
  notes: string;
  fork: PartValues;
  shock: PartValues;
}

type Kind = 'pressure' | 'length' | 'rate' | 'count';
interface Range {
  kind: Kind;
  /** in the API's unit */
  min: number;
  max: number;
  integer?: boolean;
}

/**
 * Ranges, in the API's units. Pressures, spacers and sag are the baseline's own limits (shared-types
 * BASELINE_LIMITS, the list the server checks too); clicks and coil rates are Loamline's choice: 0–60
 * clicks covers every adjuster sold, 10–2000 lb/in every fork and shock coil.
 */
export const SETTING_RANGES: Record<Exclude<keyof PartValues, 'spring'>, Range> = {
  mainPsi: { kind: 'pressure', ...BASELINE_LIMITS.measuredPressurePsi },
  endStrokePsi: { kind: 'pressure', ...BASELINE_LIMITS.endStrokePsi },
  spacers: { kind: 'count', ...BASELINE_LIMITS.spacers, integer: true },
  springRateLbPerIn: { kind: 'rate', min: 10, max: 2000 },
  reboundClicks: { kind: 'count', min: 0, max: 60, integer: true },
  compressionClicks: { kind: 'count', min: 0, max: 60, integer: true },
  sagMm: { kind: 'length', ...BASELINE_LIMITS.measuredSagMm },
};
export type FieldName = keyof typeof SETTING_RANGES;

/** The unit a field is typed in. */
export function fieldUnit(field: FieldName, prefs: UnitPrefs): string {
  switch (SETTING_RANGES[field].kind) {
    case 'pressure':
      return prefs.pressure;
    case 'length':
      return prefs.length;
    case 'rate':
      return rateUnit(prefs);
    case 'count':
      return '';
  }
}

function toShown(kind: Kind, v: number, prefs: UnitPrefs): number {
  if (kind === 'pressure') return prefs.pressure === 'bar' ? psiToBar(v) : v;
  if (kind === 'length') return prefs.length === 'in' ? mmToIn(v) : v;
  if (kind === 'rate') return rateUnit(prefs) === 'N/mm' ? lbPerInToNPerMm(v) : v;
  return v;
}
function fromShown(kind: Kind, v: number, prefs: UnitPrefs): number {
  if (kind === 'pressure') return prefs.pressure === 'bar' ? barToPsi(v) : v;
  if (kind === 'length') return prefs.length === 'in' ? inToMm(v) : v;
  if (kind === 'rate') return rateUnit(prefs) === 'N/mm' ? nPerMmToLbPerIn(v) : v;
  return v;
}
/** Decimals a field is shown with: what a gauge or a tape reads, enough to come back unchanged. */
function shownDecimals(kind: Kind, prefs: UnitPrefs): number {
  if (kind === 'pressure') return prefs.pressure === 'bar' ? 2 : 1;
  if (kind === 'length') return prefs.length === 'in' ? 2 : 1;
  if (kind === 'rate') return rateUnit(prefs) === 'N/mm' ? 1 : 0;
  return 0;
}
/** Decimals kept on the wire (psi 0.1, mm 0.1, lb/in 0.1). */
const wireDecimals = (kind: Kind): number => (kind === 'count' ? 0 : 1);

/** A number from the API as the field shows it: "85", "5.86", "" for none. */
export function showValue(field: FieldName, v: number | null, prefs: UnitPrefs): string {
  if (v === null || !Number.isFinite(v)) return '';
  const { kind } = SETTING_RANGES[field];
  const shown = round(toShown(kind, v, prefs), shownDecimals(kind, prefs));
  return String(shown);
}

/** What the field holds, in the API's unit; null when blank; NaN when not a number. */
export function readValue(field: FieldName, text: string, prefs: UnitPrefs): number | null {
  if (text.trim() === '') return null;
  const n = parseDecimal(text);
  if (Number.isNaN(n)) return Number.NaN;
  const { kind } = SETTING_RANGES[field];
  return round(fromShown(kind, n, prefs), wireDecimals(kind));
}

/** "between 1 and 1,000 psi": the bounds as the field reads them, trailing zeros dropped */
function rangeText(field: FieldName, prefs: UnitPrefs): string {
  const r = SETTING_RANGES[field];
  const d = r.kind === 'count' ? 0 : shownDecimals(r.kind, prefs);
  const f = new Intl.NumberFormat('en', { maximumFractionDigits: d });
  const unit = fieldUnit(field, prefs);
  const lo = f.format(round(toShown(r.kind, r.min, prefs), d));
  const hi = f.format(round(toShown(r.kind, r.max, prefs), d));
  return `Between ${lo} and ${hi}${unit ? ` ${unit}` : ''}`;
}

/** The message for a field's text, or undefined when it is fine (blank is fine: not measured). */
export function checkValue(field: FieldName, text: string, prefs: UnitPrefs): string | undefined {
  if (text.trim() === '') return undefined;
  const n = parseDecimal(text);
  if (Number.isNaN(n)) return 'Enter a number';
  const r = SETTING_RANGES[field];
  if (r.integer && !Number.isInteger(n)) return 'Enter a whole number';
  const v = fromShown(r.kind, n, prefs);
  // compare in the unit shown, so a bound typed exactly as it reads is accepted
  const shown = (x: number) => round(toShown(r.kind, x, prefs), shownDecimals(r.kind, prefs));
  if (n < shown(r.min) || n > shown(r.max) || !Number.isFinite(v)) return rangeText(field, prefs);
  return undefined;
}

export const BLANK_PART: PartValues = {
  spring: 'air',
  mainPsi: '',
  endStrokePsi: '',
  spacers: '',
  springRateLbPerIn: '',
  reboundClicks: '',
  compressionClicks: '',
  sagMm: '',
};

const FIELDS = Object.keys(SETTING_RANGES) as FieldName[];

export function partValues(s: PartSettings | null, prefs: UnitPrefs): PartValues {
  if (!s) return { ...BLANK_PART };
  const v: PartValues = { ...BLANK_PART, spring: s.springRateLbPerIn !== null ? 'coil' : 'air' };
  for (const f of FIELDS) v[f] = showValue(f, s[f], prefs);
  return v;
}

export function formValues(
  r: Pick<ServiceReport, 'checklist' | 'notes' | 'fork' | 'shock'>,
  prefs: UnitPrefs,
) {
  return {
    checklist: r.checklist.map((c) => ({ label: c.label, done: c.done })),
    notes: r.notes ?? '',
    fork: partValues(r.fork, prefs),
    shock: partValues(r.shock, prefs),
  } satisfies ReportFormValues;
}

const AIR_ONLY: FieldName[] = ['mainPsi', 'endStrokePsi', 'spacers'];

/** A part's settings for the API; null when nothing was entered for it. */
export function partSettings(v: PartValues, prefs: UnitPrefs): PartSettings | null {
  const out = {} as PartSettings;
  let any = false;
  for (const f of FIELDS) {
    const off = v.spring === 'coil' ? AIR_ONLY.includes(f) : f === 'springRateLbPerIn';
    const n = off ? null : readValue(f, v[f], prefs);
    out[f] = n !== null && Number.isNaN(n) ? null : n;
    if (out[f] !== null) any = true;
  }
  return any ? out : null;
}

export function reportInput(v: ReportFormValues, prefs: UnitPrefs, version = 0): ServiceReportInput {
  return {
    version,
    checklist: v.checklist
      .map((c) => ({ label: c.label.trim(), done: c.done }))
      .filter((c) => c.label !== ''),
    notes: v.notes.trim(),
    fork: partSettings(v.fork, prefs),
    shock: partSettings(v.shock, prefs),
  };
}

/** The same values, shown in other units (the user switched psi ⇄ bar or metric ⇄ imperial). */
export function convertPart(v: PartValues, from: UnitPrefs, to: UnitPrefs): PartValues {
  const next = { ...v };
  for (const f of FIELDS) {
    const n = readValue(f, v[f], from);
    if (n !== null && !Number.isNaN(n)) next[f] = showValue(f, n, to);
  }
  return next;
}

/** A server field path (`fork.mainPsi`) that is one of the form's inputs. */
export function formFieldOf(path: string): `${Part}.${FieldName}` | 'notes' | null {
  if (path === 'notes') return 'notes';
  const [part, field] = path.split('.');
  if ((part === 'fork' || part === 'shock') && (FIELDS as string[]).includes(field))
    return `${part}.${field as FieldName}`;
  return null;
}
