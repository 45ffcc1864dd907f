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
    frontendDist: env.FRONTEND_DIST ?? join(__dirname, '..', '..', '..', 'frontend', 'dist'),
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
  };
});

export const mailConfig = registerAs('mail', () => {
  const env = validateEnv(process.env);
  return { host: env.SMTP_HOST, port: env.SMTP_PORT, from: env.MAIL_FROM };
});

export const paymentsConfig = registerAs('payments', () => {
  const env = validateEnv(process.env);
  return {
    host: env.PAYMENTS_HOST,
    port: env.PAYMENTS_PORT,
    secretKey: env.PAYMENTS_SECRET_KEY,
    publishableKey: env.PAYMENTS_PUBLISHABLE_KEY,
    webhookSecret: env.PAYMENTS_WEBHOOK_SECRET,
  };
});

export type AppConfig = ReturnType<typeof appConfig>;
export type DatabaseConfig = ReturnType<typeof databaseConfig>;
export type AuthConfig = ReturnType<typeof authConfig>;
export type MailConfig = ReturnType<typeof mailConfig>;
export type PaymentsConfig = ReturnType<typeof paymentsConfig>;
