import { applyDecorators } from '@nestjs/common';
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsEmail, IsString, MaxLength, MinLength, ValidateBy, ValidateIf } from 'class-validator';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '@loamline/shared-types';
import { normaliseEmail } from '../email';

const trim = Transform(({ value }: { value: unknown }) =>
  typeof value === 'string' ? value.normalize('NFC').trim() : value,
);

/**
 * Characters a name may not hold: control characters (NUL, tabs, line breaks: \p{Cc}), the
 * bidirectional embeddings, overrides and isolates (U+202A–202E, U+2066–2069) and marks
 * (U+200E, U+200F, U+061C) that make text display in another order than it is stored, lone
 * surrogates, and the non-characters U+FFFE/U+FFFF.
 */
const FORBIDDEN_IN_NAME = /[\p{Cc}\u202A-\u202E\u2066-\u2069\u200E\u200F\u061C\uFFFE\uFFFF]|\p{Cs}/u;
/** Something a reader sees: a letter, digit, punctuation or symbol (not only spaces or zero-width marks). */
const VISIBLE = /[\p{L}\p{N}\p{P}\p{S}]/u;

/** Why a display name is refused, or null when it is fine (also used by the unit test). */
export function nameProblem(name: string): string | null {
  if (FORBIDDEN_IN_NAME.test(name)) return 'must not contain control or text-direction characters';
  if (!VISIBLE.test(name)) return 'must contain a visible character';
  return null;
}

const DisplayName = (): PropertyDecorator =>
  ValidateBy({
    name: 'displayName',
    validator: {
      validate: (v: unknown) => typeof v === 'string' && nameProblem(v) === null,
      defaultMessage: (args) =>
        typeof args?.value === 'string' ? (nameProblem(args.value) ?? 'is invalid') : 'must be a string',
    },
  });
const emailForm = Transform(({ value }: { value: unknown }) =>
  typeof value === 'string' ? normaliseEmail(value) : value,
);

/**
 * An e-mail address in its one stored form (common/email.ts: NFC, trimmed, lower-cased, IDNA
 * domain) before it is checked.
 */
export const EmailField = (): PropertyDecorator =>
  applyDecorators(
    ApiProperty({ example: 'rider@example.test', maxLength: 254 }),
    emailForm,
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
 * A person's or a thing's display name: NFC, trimmed, 1 to `max` characters, with something
 * visible in it and no control or text-direction characters (nameProblem). `optional` (for PATCH):
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
    DisplayName(),
  );
