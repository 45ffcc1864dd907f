/** Injection token of the SignInDelays instance (its counts are shared in `sign_in_failures`). */
export const SIGN_IN_DELAYS = Symbol('SIGN_IN_DELAYS');
