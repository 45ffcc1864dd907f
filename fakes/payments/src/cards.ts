/**
 * The test cards and test payment-method tokens the fake knows, and what confirming with each does.
 * The numbers are the hosted service's documented test numbers, so a flow built against the fake
 * behaves the same in the service's own test mode.
 */
export type CardOutcome = 'succeed' | 'decline' | 'insufficient_funds' | 'authenticate';

export interface CardDetails {
  brand: string;
  last4: string;
  exp_month: number;
  exp_year: number;
  funding: 'credit' | 'debit';
  country: string;
  outcome: CardOutcome;
}

interface TestCard {
  number: string;
  token: string;
  brand: string;
  outcome: CardOutcome;
}

export const TEST_CARDS: readonly TestCard[] = [
  { number: '4242424242424242', token: 'pm_card_visa', brand: 'visa', outcome: 'succeed' },
  { number: '5555555555554444', token: 'pm_card_mastercard', brand: 'mastercard', outcome: 'succeed' },
  { number: '4000000000000002', token: 'pm_card_chargeDeclined', brand: 'visa', outcome: 'decline' },
  {
    number: '4000000000009995',
    token: 'pm_card_chargeDeclinedInsufficientFunds',
    brand: 'visa',
    outcome: 'insufficient_funds',
  },
  {
    number: '4000002760003184',
    token: 'pm_card_authenticationRequired',
    brand: 'visa',
    outcome: 'authenticate',
  },
];

export function luhnValid(digits: string): boolean {
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    let d = Number(digits[digits.length - 1 - i]);
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return sum % 10 === 0;
}

export function brandOf(digits: string): string {
  if (/^4/.test(digits)) return 'visa';
  if (/^(5[1-5]|2[2-7])/.test(digits)) return 'mastercard';
  if (/^3[47]/.test(digits)) return 'amex';
  if (/^(6011|65)/.test(digits)) return 'discover';
  return 'unknown';
}

function nextYear(): number {
  return new Date().getUTCFullYear() + 1;
}

/** The card behind a test token (`pm_card_visa` …), or null for an unknown token. */
export function cardForToken(token: string): CardDetails | null {
  const card = TEST_CARDS.find((c) => c.token === token);
  if (!card) return null;
  return {
    brand: card.brand,
    last4: card.number.slice(-4),
    exp_month: 12,
    exp_year: nextYear(),
    funding: 'credit',
    country: 'US',
    outcome: card.outcome,
  };
}

export interface CardProblem {
  code:
    'invalid_number' | 'incorrect_number' | 'invalid_expiry_month' | 'invalid_expiry_year' | 'invalid_cvc';
  message: string;
  param: string;
}

/** Checks raw card data (`payment_method_data[card]`); a problem is answered as a card error. */
export function cardFromData(
  number: string,
  expMonth: string,
  expYear: string,
  cvc: string,
  now = new Date(),
): CardDetails | CardProblem {
  const digits = number.replace(/[\s-]/g, '');
  if (!/^\d{12,19}$/.test(digits) || !luhnValid(digits)) {
    return { code: 'invalid_number', message: 'Your card number is invalid.', param: 'number' };
  }
  const month = Number(expMonth);
  if (!/^\d{1,2}$/.test(expMonth) || month < 1 || month > 12) {
    return {
      code: 'invalid_expiry_month',
      message: "Your card's expiration month is invalid.",
      param: 'exp_month',
    };
  }
  let year = Number(expYear);
  if (/^\d{2}$/.test(expYear)) year += 2000;
  const thisYear = now.getUTCFullYear();
  const thisMonth = now.getUTCMonth() + 1;
  if (!/^\d{2}(\d{2})?$/.test(expYear) || year < thisYear || (year === thisYear && month < thisMonth)) {
    return {
      code: 'invalid_expiry_year',
      message: "Your card's expiration year is invalid.",
      param: 'exp_year',
    };
  }
  const brand = brandOf(digits);
  if (cvc !== '' && !(brand === 'amex' ? /^\d{4}$/ : /^\d{3}$/).test(cvc)) {
    return { code: 'invalid_cvc', message: "Your card's security code is invalid.", param: 'cvc' };
  }
  const card = TEST_CARDS.find((c) => c.number === digits);
  if (!card) {
    return {
      code: 'incorrect_number',
      message: 'Your card number is incorrect. Use one of the test cards (4242 4242 4242 4242 …).',
      param: 'number',
    };
  }
  return {
    brand: card.brand,
    last4: digits.slice(-4),
    exp_month: month,
    exp_year: year,
    funding: 'credit',
    country: 'US',
    outcome: card.outcome,
  };
}
