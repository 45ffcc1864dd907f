import { Type, plainToInstance } from 'class-transformer';
import { IsIn, IsInt, IsOptional, IsString, IsUrl, Max, Min, MinLength, validateSync } from 'class-validator';

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

  @IsOptional()
  @IsString()
  FRONTEND_DIST?: string;

  @IsString()
  SMTP_HOST = '127.0.0.1';

  @IsInt()
  @Min(1)
  @Max(65535)
  @Type(() => Number)
  SMTP_PORT: number = 1025;

  @IsString()
  MAIL_FROM = 'Loamline <no-reply@loamline.example.test>';

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
