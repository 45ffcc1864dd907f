/** Injection token of the SignInDelays instance (one per app: failures are counted in memory). */
export const SIGN_IN_DELAYS = Symbol('SIGN_IN_DELAYS');
