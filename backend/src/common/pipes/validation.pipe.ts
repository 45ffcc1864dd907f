import { BadRequestException, ValidationPipe, type ValidationError } from '@nestjs/common';
import { cacheValidationMetadata } from './validation-metadata-cache';

/** Flattens nested validation errors to `{ "fork.travelMm": "must not be less than 1" }`. */
export function flattenValidationErrors(
  errors: ValidationError[],
  parent = '',
  out: Record<string, string> = {},
): Record<string, string> {
  for (const e of errors) {
    const path = parent ? `${parent}.${e.property}` : e.property;
    if (e.constraints) {
      out[path] = Object.values(e.constraints)
        .map((m) => (m.startsWith(`${e.property} `) ? m.slice(e.property.length + 1) : m))
        .join('; ');
    }
    if (e.children?.length) flattenValidationErrors(e.children, path, out);
  }
  return out;
}

/**
 * The one global ValidationPipe: whitelist, reject unknown fields, transform to the DTO classes.
 * Its 400 names every bad field in `fields` and in the message. class-validator's metadata look-ups
 * are kept per class (validation-metadata-cache.ts): the same rules, without rebuilding them for
 * every nested object of every request.
 */
export function createValidationPipe(): ValidationPipe {
  cacheValidationMetadata();
  return new ValidationPipe({
    whitelist: true,
    forbidNonWhitelisted: true,
    transform: true,
    exceptionFactory: (errors) => {
      const fields = flattenValidationErrors(errors);
      const message = Object.entries(fields)
        .map(([k, v]) => `${k}: ${v}`)
        .join('; ');
      return new BadRequestException({ message: message || 'Invalid input', fields });
    },
  });
}
