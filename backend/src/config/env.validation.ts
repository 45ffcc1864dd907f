import { Type, plainToInstance } from 'class-transformer';
import {
  IsIn,
  IsInt,
  NotEquals,
  IsOptional,
  IsString,
  IsUrl,
  Matches,
  ValidateIf,
  Max,
  Min,
  MinLength,
  validateSync,
} from 'class-validator';

/**
 * Every environment variable the server reads, validated once at boot. A missing or malformed
 * value stops the server with a message that names it. `.env.example` documents each one.
 */
export class EnvironmentVariables {
  @IsIn(['development', 'production', 'test'])
  NODE_ENV: 'development' | 'production' | 'test' = 'development';

  @IsInt()
  @Min(1)
  @Max(65535)
  @Type(() => Number)
  APP_PORT: number = 3000;

  @IsString()
  APP_HOST = '127.0.0.1';

  /** The address riders use, for links in e-mails. */
  @IsUrl({ require_tld: false, require_protocol: true })
  APP_URL = 'http://127.0.0.1:3000';

  /**
   * Other origins (comma-separated, e.g. the Vite dev server `http://127.0.0.1:5173`) whose
   * browser requests may change state; the app's own origin (APP_URL) always may.
   */
  @IsOptional()
  @IsString()
  TRUSTED_ORIGINS?: string;

  /**
   * The reverse proxy in front, whose X-Forwarded-For / -Proto the server believes (Express's
   * `trust proxy`: `loopback`, an address list or a hop count). Unset: none, and rate limits key on
   * the connecting address. `true` is refused: it would believe any client.
   */
  @IsOptional()
  @IsString()
  @NotEquals('true', { message: 'must name the proxy (e.g. loopback), not true' })
  TRUST_PROXY?: string;

  /** Serve the OpenAPI page and document (/api/docs) in production too. */
  @IsOptional()
  @IsIn(['true', 'false'])
  API_DOCS?: 'true' | 'false';

  /** Serve the front end's source maps in production too. */
  @IsOptional()
  @IsIn(['true', 'false'])
  SERVE_SOURCE_MAPS?: 'true' | 'false';

  @IsString()
  DB_HOST = '127.0.0.1';

  @IsInt()
  @Min(1)
  @Max(65535)
  @Type(() => Number)
  DB_PORT: number = 3307;

  @IsString()
  DB_NAME = 'loamline';

  @IsString()
  DB_USER = 'loamline';

  @IsString()
  DB_PASSWORD: string;

  /**
   * The longest one query of the app may take before it fails (and its connection is dropped), so
   * a database that stops answering gives 503s, not requests that hang (database/pool-deadlines.ts).
   * The migrations (TypeORM CLI) have none.
   */
  @IsInt()
  @Min(100)
  @Max(600000)
  @Type(() => Number)
  DB_QUERY_TIMEOUT_MS: number = 5000;

  /** The longest a request waits for a free database connection (pool full or database away). */
  @IsInt()
  @Min(100)
  @Max(600000)
  @Type(() => Number)
  DB_ACQUIRE_TIMEOUT_MS: number = 5000;

  @IsString()
  @MinLength(32)
  JWT_SECRET: string;

  /** Lifetime of a session token; a request after half of it gets a fresh cookie. */
  @IsInt()
  @Min(1)
  @Max(1440)
  @Type(() => Number)
  SESSION_TTL_MINUTES: number = 30;

  /** Requests per minute per IP on sign-in, register and both reset routes (default 5; 1000 under NODE_ENV=test). */
  @IsOptional()
  @IsInt()
  @Min(1)
  @Type(() => Number)
  AUTH_RATE_LIMIT?: number;

  /** First step of the growing delay after repeated failed sign-ins for one address. */
  @IsInt()
  @Min(0)
  @Max(10000)
  @Type(() => Number)
  SIGN_IN_FAILURE_DELAY_MS: number = 250;

  /** How long a password-reset link works. */
  @IsInt()
  @Min(1)
  @Max(1440)
  @Type(() => Number)
  PASSWORD_RESET_TTL_MINUTES: number = 30;

  /** How long a staff invitation link works. */
  @IsInt()
  @Min(1)
  @Max(720)
  @Type(() => Number)
  INVITATION_TTL_HOURS: number = 168;

  /**
   * A password-reset request answers no sooner than this after it arrived, whether or not the
   * address has an account, so its timing tells nothing (docs/security.md).
   */
  @IsInt()
  @Min(0)
  @Max(5000)
  @Type(() => Number)
  PASSWORD_RESET_MIN_MS: number = 250;

  @IsOptional()
  @IsString()
  FRONTEND_DIST?: string;

  /**
   * Where uploaded photos and bench curves are kept (the disk upload store), outside the web
   * root; default `<repo>/.data/uploads`.
   */
  @IsOptional()
  @IsString()
  UPLOADS_DIR?: string;

  /**
   * Where uploads are kept: `disk` (UPLOADS_DIR, the default) or `s3`, an S3-compatible object
   * store named by the S3_* variables below (required then).
   */
  @IsIn(['disk', 's3'])
  UPLOADS_STORE: 'disk' | 's3' = 'disk';

  /**
   * The object store's address (`http://127.0.0.1:9000` for a local server); unset: the
   * provider's own endpoint for S3_REGION.
   */
  @IsOptional()
  @IsUrl({ require_tld: false, require_protocol: true, protocols: ['http', 'https'] })
  S3_ENDPOINT?: string;

  @ValidateIf((e: EnvironmentVariables) => e.UPLOADS_STORE === 's3')
  @IsString()
  @MinLength(1)
  S3_REGION?: string;

  /** S3's bucket naming rules: 3–63 lower-case letters, digits, dots and hyphens. */
  @ValidateIf((e: EnvironmentVariables) => e.UPLOADS_STORE === 's3')
  @Matches(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, {
    message: 'must be a bucket name: 3-63 lower-case letters, digits, dots and hyphens',
  })
  S3_BUCKET?: string;

  @ValidateIf((e: EnvironmentVariables) => e.UPLOADS_STORE === 's3')
  @IsString()
  @MinLength(1)
  S3_ACCESS_KEY_ID?: string;

  @ValidateIf((e: EnvironmentVariables) => e.UPLOADS_STORE === 's3')
  @IsString()
  @MinLength(1)
  S3_SECRET_ACCESS_KEY?: string;

  /** `true`: `<endpoint>/<bucket>/<key>` (most self-hosted servers); `false`: `<bucket>.<endpoint>`. */
  @IsIn(['true', 'false'])
  S3_FORCE_PATH_STYLE: 'true' | 'false' = 'false';

  /** `true`: create S3_BUCKET at startup when it is missing; `false`: a missing bucket stops the boot. */
  @IsIn(['true', 'false'])
  S3_CREATE_BUCKET: 'true' | 'false' = 'false';

  /** How long one call to the object store may take before it counts as down (ms). */
  @IsInt()
  @Min(500)
  @Max(120000)
  @Type(() => Number)
  S3_TIMEOUT_MS: number = 10000;

  @IsString()
  SMTP_HOST = '127.0.0.1';

  @IsInt()
  @Min(1)
  @Max(65535)
  @Type(() => Number)
  SMTP_PORT: number = 1025;

  @IsString()
  MAIL_FROM = 'Loamline <no-reply@loamline.example.test>';

  /** How often the mail relay sweeps the outbox for due mail; 0 turns the sweep off. */
  @IsInt()
  @Min(0)
  @Type(() => Number)
  MAIL_RELAY_INTERVAL_MS: number = 2000;

  /** The first wait after a failed send; each further failure doubles it (up to 30 min). */
  @IsInt()
  @Min(1)
  @Type(() => Number)
  MAIL_RETRY_BASE_MS: number = 5000;

  /** Attempts per mail before the relay gives up on it. */
  @IsInt()
  @Min(1)
  @Max(100)
  @Type(() => Number)
  MAIL_MAX_ATTEMPTS: number = 12;

  @IsString()
  PAYMENTS_HOST = '127.0.0.1';

  @IsInt()
  @Min(1)
  @Max(65535)
  @Type(() => Number)
  PAYMENTS_PORT: number = 12111;

  @IsString()
  PAYMENTS_SECRET_KEY = 'sk_test_loamline_local';

  @IsString()
  PAYMENTS_PUBLISHABLE_KEY = 'pk_test_loamline_local';

  @IsString()
  PAYMENTS_WEBHOOK_SECRET = 'whsec_loamline_local';

  /** `http` for the local payment fake; the hosted service speaks `https`. */
  @IsIn(['http', 'https'])
  PAYMENTS_PROTOCOL: 'http' | 'https' = 'http';

  /**
   * A script that defines `window.Stripe` for the browser, loaded before the payment library (the
   * local fake serves one at `/js/stripe.js`); empty: the library loads the hosted service's own.
   * Its origin is allowed by the Content-Security-Policy.
   */
  @IsOptional()
  @IsString()
  PAYMENTS_SCRIPT_URL?: string;

  /** How long one payment-service call may take before it counts as down (ms). */
  @IsInt()
  @Min(500)
  @Type(() => Number)
  PAYMENTS_TIMEOUT_MS: number = 8000;
}

export function validateEnv(config: Record<string, unknown>): EnvironmentVariables {
  const validated = plainToInstance(EnvironmentVariables, config, {
    enableImplicitConversion: true,
    exposeDefaultValues: true,
  });
  const errors = validateSync(validated, { skipMissingProperties: false });
  if (errors.length > 0) {
    const list = errors
      .map((e) => `${e.property}: ${Object.values(e.constraints ?? {}).join(', ')}`)
      .join('; ');
    throw new Error(`Invalid environment: ${list}`);
  }
  return validated;
}
