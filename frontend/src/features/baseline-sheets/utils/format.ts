import type { RidingFeel, RidingStyle } from '@loamline/shared-types';
import { formatNumber, formatQuantity, type UnitPrefs } from '@/lib/units';

export const STYLE_LABELS: Record<RidingStyle, string> = {
  'cross-country': 'Cross-country',
  trail: 'Trail',
  enduro: 'Enduro',
  downhill: 'Downhill',
  park: 'Park / jump',
};

export const FEEL_LABELS: Record<RidingFeel, string> = {
  supple: 'Supple',
  balanced: 'Balanced',
  firm: 'Firm',
};

/** "82 psi" or "5.7 bar", rounded to what a pump reads (docs/spring-model.md: 1 psi, 0.1 bar). */
export const pressure = (psi: number, prefs: UnitPrefs) => formatQuantity('pressure', psi, prefs);

export const percent = (pct: number) => `${formatNumber(pct, 0)} %`;

const dateFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
/** "14 Mar 2026" in the browser's time zone. */
export const savedOn = (iso: string) => dateFormat.format(new Date(iso));
