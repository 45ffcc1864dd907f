/** How many minor units make one major unit of an ISO 4217 currency (EUR 2, JPY 0, BHD 3). */
export function minorDigits(currency: string): number {
  return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions()
    .maximumFractionDigits as number;
}

/**
 * An amount in minor units (what the API sends) as money in the shop's currency: 8900 EUR →
 * "€89.00" (en-GB) or "89,00 €" (de-DE). `locale` undefined is the browser's.
 */
export function formatMoney(minor: number, currency: string, locale?: string): string {
  const digits = minorDigits(currency);
  return new Intl.NumberFormat(locale, {
    style: 'currency',
    currency,
    minimumFractionDigits: digits,
    maximumFractionDigits: digits,
  }).format(minor / 10 ** digits);
}
