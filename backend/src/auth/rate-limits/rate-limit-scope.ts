/**
 * Injection token of the string every shared rate-limit key is hashed with. '' in the app: every
 * instance must count in the same place. Tests give each app its own scope so one test file's
 * requests from 127.0.0.1 do not spend another's budget (test/utils/test-app.ts), and the same
 * scope to two apps that are meant to share one.
 */
export const RATE_LIMIT_SCOPE = Symbol('RATE_LIMIT_SCOPE');
