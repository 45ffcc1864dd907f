/** Money in the shop's currency: entered in major units (12.50), sent in minor units (1250). */

/** How many minor digits `currency` has (EUR 2, JPY 0, BHD 3), as Intl knows it. */
export function minorDigits(currency: string): number {
  try {
    return (
      new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ??
      2
    );
  } catch {
    return 2;
  }
}

/** "12.50" (or "12,5") → 1250; null when it is not an amount. */
export function toMinor(major: string, currency: string): number | null {
  const t = major.trim().replace(',', '.');
  if (!/^\d+(\.\d+)?$/.test(t)) return null;
  const digits = minorDigits(currency);
  const [whole, frac = ''] = t.split('.');
  if (frac.length > digits) return null;
  return Number(whole) * 10 ** digits + Number(frac.padEnd(digits, '0') || 0);
}

/** 1250 → "12.50" for an input. */
export function toMajorInput(minor: number, currency: string): string {
  const digits = minorDigits(currency);
  return (minor / 10 ** digits).toFixed(digits);
}

/** 1250 → "€12.50"; 0 → "Free". */
export function formatMoney(minor: number, currency: string): string {
  if (minor === 0) return 'Free';
  const digits = minorDigits(currency);
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(minor / 10 ** digits);
}
