import { applyDecorators } from '@nestjs/common';
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsEmail, IsString, MaxLength, MinLength, ValidateIf } from 'class-validator';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '@loamline/shared-types';

const trim = Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value));
const trimLower = Transform(({ value }: { value: unknown }) =>
  typeof value === 'string' ? value.trim().toLowerCase() : value,
);

/** An e-mail address, trimmed and lower-cased before it is checked. */
export const EmailField = (): PropertyDecorator =>
  applyDecorators(
    ApiProperty({ example: 'rider@example.test', maxLength: 254 }),
    trimLower,
    IsEmail({}, { message: 'must be an e-mail address' }),
    MaxLength(254),
  );

/** A new password: 10 to 128 characters (see PASSWORD_MIN_LENGTH in shared-types). */
export const NewPasswordField = (): PropertyDecorator =>
  applyDecorators(
    ApiProperty({ minLength: PASSWORD_MIN_LENGTH, maxLength: PASSWORD_MAX_LENGTH, format: 'password' }),
    IsString(),
    MinLength(PASSWORD_MIN_LENGTH, { message: `must be at least ${PASSWORD_MIN_LENGTH} characters` }),
    MaxLength(PASSWORD_MAX_LENGTH, { message: `must be at most ${PASSWORD_MAX_LENGTH} characters` }),
  );

/**
 * A person's or a thing's display name: trimmed, 1 to `max` characters. `optional` (for PATCH):
 * it may be left out, but null or empty is still a 400.
 */
export const NameField = (
  max: number,
  example: string,
  opts: { optional?: boolean } = {},
): PropertyDecorator =>
  applyDecorators(
    ...(opts.optional
      ? [
          ApiPropertyOptional({ example, minLength: 1, maxLength: max }),
          ValidateIf((o: Record<string, unknown>, v: unknown) => v !== undefined),
        ]
      : [ApiProperty({ example, minLength: 1, maxLength: max })]),
    trim,
    IsString(),
    MinLength(1, { message: 'must not be empty' }),
    MaxLength(max),
  );
