import { formatMoney as formatInCurrency, minorDigits } from '@/features/booking/utils/money';

/*
 * Money of payments: amounts come in minor units of the shop's currency (ISO 4217). How many minor
 * units make one major unit is whatever Intl says the currency has (`maximumFractionDigits`:
 * EUR 2, JPY 0, KWD 3), so a yen amount is never divided by 100 and a dinar amount is divided by 1000.
 */

export { minorDigits };
export { toMajorInput, toMinor } from '@/features/workshop/utils/money';

/** 2000 GBP → "£20.00" in the browser's language (or `locale`); 0 is "£0.00", never "Free". */
export function formatMoney(minor: number, currency: string, locale?: string): string {
  return formatInCurrency(minor, currency, locale);
}

/** A refund, as money going out: "-£20.00" (the locale's own minus and its place). */
export function formatRefund(minor: number, currency: string, locale?: string): string {
  return formatMoney(-Math.abs(minor), currency, locale);
}
