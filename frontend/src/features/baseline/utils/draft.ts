import { emptyFormValues, type BaselineFormValues } from '../form';

/**
 * The wizard's input and step, kept for this tab (sessionStorage): a reload, a phone that drops the
 * tab in the background, a visit to another page or a sign-in round trip ("Save as baseline sheet")
 * come back to what the rider entered, on the same step. Nothing leaves the browser; the tab's
 * storage goes when the tab is closed.
 */
export const DRAFT_KEY = 'loamline.baseline-draft';

export interface Draft {
  values: BaselineFormValues;
  /** index into STEPS */
  step: number;
}

/**
 * `stored` read back in the shape of `template`: a blank number (NaN, kept as null by JSON) is NaN
 * again, a value of another type than the template's is dropped, and a field the stored draft does
 * not have (the form grew since) keeps the template's value.
 */
export function restoreLike<T>(template: T, stored: unknown): T {
  if (typeof template === 'number') {
    if (typeof stored === 'number') return stored as T;
    return (stored === null ? Number.NaN : template) as T;
  }
  if (typeof template === 'string' || typeof template === 'boolean') {
    return (typeof stored === typeof template ? stored : template) as T;
  }
  if (Array.isArray(template)) return (Array.isArray(stored) ? stored : template) as T;
  if (template && typeof template === 'object') {
    const from = stored && typeof stored === 'object' ? (stored as Record<string, unknown>) : {};
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(template as Record<string, unknown>))
      out[k] = restoreLike(v, from[k]);
    return out as T;
  }
  return template;
}

export function readDraft(): Draft | null {
  try {
    const raw = window.sessionStorage.getItem(DRAFT_KEY);
    if (!raw) return null;
    const parsed = JSON.parse(raw) as { values?: unknown; step?: unknown };
    if (!parsed || typeof parsed !== 'object' || !parsed.values) return null;
    const step = typeof parsed.step === 'number' && Number.isInteger(parsed.step) ? parsed.step : 0;
    return { values: restoreLike(emptyFormValues(), parsed.values), step };
  } catch {
    return null; // garbled or storage refused: start afresh, never break the page
  }
}

export function writeDraft(draft: Draft): void {
  try {
    window.sessionStorage.setItem(DRAFT_KEY, JSON.stringify(draft));
  } catch {
    // storage refused (a private mode, full): the wizard works on, a reload starts afresh
  }
}

export function clearDraft(): void {
  try {
    window.sessionStorage.removeItem(DRAFT_KEY);
  } catch {
    // nothing kept
  }
}
