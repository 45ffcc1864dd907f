import { registerAs } from '@nestjs/config';
import { join } from 'node:path';
import { validateEnv } from './env.validation';

export const appConfig = registerAs('app', () => {
  const env = validateEnv(process.env);
  return {
    env: env.NODE_ENV,
    port: env.APP_PORT,
    host: env.APP_HOST,
    url: env.APP_URL,
    /** Origins whose browser requests may change state: the app's own, plus TRUSTED_ORIGINS. */
    trustedOrigins: [
      new URL(env.APP_URL).origin,
      ...(env.TRUSTED_ORIGINS ?? '')
        .split(',')
        .map((o) => o.trim())
        .filter(Boolean)
        .map((o) => new URL(o).origin),
    ],
    /** Express's `trust proxy`: false unless TRUST_PROXY names the proxy in front. */
    trustProxy: parseTrustProxy(env.TRUST_PROXY),
    /** The OpenAPI page and document: always outside production, in production only with API_DOCS=true. */
    apiDocs: env.API_DOCS ? env.API_DOCS === 'true' : env.NODE_ENV !== 'production',
    /** Serve the front end's *.map files (production: only with SERVE_SOURCE_MAPS=true). */
    serveSourceMaps: env.SERVE_SOURCE_MAPS ? env.SERVE_SOURCE_MAPS === 'true' : env.NODE_ENV !== 'production',
    frontendDist: env.FRONTEND_DIST ?? join(__dirname, '..', '..', '..', 'frontend', 'dist'),
    /** the disk upload store's directory (photos, curves), never served as static files */
    uploadsDir: env.UPLOADS_DIR?.trim() || join(__dirname, '..', '..', '..', '.data', 'uploads'),
    /** which upload store: the disk (uploadsDir) or an S3-compatible object store (s3) */
    uploadsStore: env.UPLOADS_STORE,
    /** the S3 upload store's settings, when UPLOADS_STORE=s3 (validated as required then) */
    s3:
      env.UPLOADS_STORE === 's3'
        ? {
            endpoint: env.S3_ENDPOINT?.trim() || null,
            region: env.S3_REGION!,
            bucket: env.S3_BUCKET!,
            accessKeyId: env.S3_ACCESS_KEY_ID!,
            secretAccessKey: env.S3_SECRET_ACCESS_KEY!,
            forcePathStyle: env.S3_FORCE_PATH_STYLE === 'true',
            createBucket: env.S3_CREATE_BUCKET === 'true',
            timeoutMs: env.S3_TIMEOUT_MS,
          }
        : null,
  };
});

export const databaseConfig = registerAs('database', () => {
  const env = validateEnv(process.env);
  return {
    host: env.DB_HOST,
    port: env.DB_PORT,
    name: env.DB_NAME,
    user: env.DB_USER,
    password: env.DB_PASSWORD,
    queryTimeoutMs: env.DB_QUERY_TIMEOUT_MS,
    acquireTimeoutMs: env.DB_ACQUIRE_TIMEOUT_MS,
  };
});

export const authConfig = registerAs('auth', () => {
  const env = validateEnv(process.env);
  return {
    jwtSecret: env.JWT_SECRET,
    sessionTtlSeconds: env.SESSION_TTL_MINUTES * 60,
    rateLimitPerMinute: env.AUTH_RATE_LIMIT ?? (env.NODE_ENV === 'test' ? 1000 : 5),
    failureDelayMs: env.SIGN_IN_FAILURE_DELAY_MS,
    passwordResetTtlMinutes: env.PASSWORD_RESET_TTL_MINUTES,
    invitationTtlHours: env.INVITATION_TTL_HOURS,
    passwordResetMinMs: env.PASSWORD_RESET_MIN_MS,
  };
});

export const mailConfig = registerAs('mail', () => {
  const env = validateEnv(process.env);
  return {
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    from: env.MAIL_FROM,
    relayIntervalMs: env.MAIL_RELAY_INTERVAL_MS,
    retryBaseMs: env.MAIL_RETRY_BASE_MS,
    maxAttempts: env.MAIL_MAX_ATTEMPTS,
  };
});

export const paymentsConfig = registerAs('payments', () => {
  const env = validateEnv(process.env);
  return {
    host: env.PAYMENTS_HOST,
    port: env.PAYMENTS_PORT,
    secretKey: env.PAYMENTS_SECRET_KEY,
    publishableKey: env.PAYMENTS_PUBLISHABLE_KEY,
    webhookSecret: env.PAYMENTS_WEBHOOK_SECRET,
    protocol: env.PAYMENTS_PROTOCOL,
    scriptUrl: env.PAYMENTS_SCRIPT_URL?.trim() || null,
    timeoutMs: env.PAYMENTS_TIMEOUT_MS,
  };
});

/**
 * TRUST_PROXY: unset, empty or `false` → trust nothing (req.ip is the socket's peer); `true` is
 * refused (it would trust any X-Forwarded-For); a number is the count of proxy hops; anything else
 * is Express's list form (`loopback`, `10.0.0.1`, `uniquelocal, 10.1.2.3`).
 */
export function parseTrustProxy(value: string | undefined): false | number | string[] {
  const v = (value ?? '').trim();
  if (v === '' || v === 'false' || v === '0') return false;
  if (/^\d+$/.test(v)) return Number(v);
  return v
    .split(',')
    .map((s) => s.trim())
    .filter(Boolean);
}

export type AppConfig = ReturnType<typeof appConfig>;
export type DatabaseConfig = ReturnType<typeof databaseConfig>;
export type AuthConfig = ReturnType<typeof authConfig>;
export type MailConfig = ReturnType<typeof mailConfig>;
export type PaymentsConfig = ReturnType<typeof paymentsConfig>;
