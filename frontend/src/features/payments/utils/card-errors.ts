import type { StripeError } from '@stripe/stripe-js';

export const DECLINED = 'Your card was declined. Nothing was charged. Try another card.';
export const INSUFFICIENT_FUNDS =
  'The card has insufficient funds. Nothing was charged. Try another card, or pay once there is enough on it.';
export const AUTHENTICATION_FAILED =
  "The bank couldn't confirm it was you, so nothing was charged. Try again, or use another card.";

/** What a failed card payment means for the rider, by the payment service's code and decline code. */
export function cardErrorMessage(error: Pick<StripeError, 'code' | 'decline_code' | 'message'>): string {
  if (error.decline_code === 'insufficient_funds' || error.code === 'insufficient_funds')
    return INSUFFICIENT_FUNDS;
  if (
    error.code === 'payment_intent_authentication_failure' ||
    error.code === 'authentication_required' ||
    error.decline_code === 'authentication_required'
  )
    return AUTHENTICATION_FAILED;
  if (error.code === 'card_declined') return DECLINED;
  return error.message || "The payment didn't go through. Check the card's details and try again.";
}
