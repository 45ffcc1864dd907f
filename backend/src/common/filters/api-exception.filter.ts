import {
  type ArgumentsHost,
  BadRequestException,
  Catch,
  type ExceptionFilter,
  HttpException,
  HttpStatus,
  Logger,
} from '@nestjs/common';
import type { Response } from 'express';
import type { ApiError } from '@loamline/shared-types';
import {
  DATABASE_UNAVAILABLE_MESSAGE,
  RETRY_AFTER_SECONDS,
  WRITE_CONFLICT_MESSAGE,
  isDatabaseUnavailable,
  isWriteConflict,
} from './database-errors';
import { DomainError } from '../errors/domain-errors';

/**
 * Turns every error into the one shape of shared-types' `ApiError`. A database that cannot be
 * reached is a 503 with a plain message (one warning line, no stack); every 503 (the database, the
 * payment service) carries `Retry-After` (RFC 9110, section 10.2.3); a write that lost to another
 * at the same moment (a deadlock or a Galera certification conflict the transaction's retries did
 * not get past) is a 409; anything else that is not an HttpException is logged and answered as a
 * 500 without internals.
 */
@Catch()
export class ApiExceptionFilter implements ExceptionFilter {
  private readonly logger = new Logger(ApiExceptionFilter.name);

  catch(exception: unknown, host: ArgumentsHost): void {
    const res = host.switchToHttp().getResponse<Response>();
    if (isDatabaseUnavailable(exception)) {
      const e = exception as { code?: string; message?: string };
      this.logger.warn(`Database unreachable: ${e.code ?? e.message ?? 'unknown'}`);
      const body: ApiError = {
        statusCode: 503,
        error: 'Service Unavailable',
        message: DATABASE_UNAVAILABLE_MESSAGE,
      };
      res.status(503).setHeader('Retry-After', String(RETRY_AFTER_SECONDS));
      res.json(body);
      return;
    }
    if (isWriteConflict(exception)) {
      this.logger.warn('Write conflict answered as 409 (deadlock or cluster certification)');
      const body: ApiError = { statusCode: 409, error: 'Conflict', message: WRITE_CONFLICT_MESSAGE };
      res.status(409).json(body);
      return;
    }
    const body = this.toApiError(exception);
    if (body.statusCode >= 500 && body.statusCode !== 503) this.logger.error(exception);
    if (body.statusCode === 503) res.setHeader('Retry-After', String(RETRY_AFTER_SECONDS));
    res.status(body.statusCode).json(body);
  }

  private toApiError(exception: unknown): ApiError {
    if (exception instanceof DomainError) {
      const statusCode = exception.status;
      const out: ApiError = {
        statusCode,
        error: titleCase(HttpStatus[statusCode] ?? 'Error'),
        message: exception.message,
      };
      if (exception.fields) out.fields = exception.fields;
      return out;
    }
    if (exception instanceof HttpException) {
      const statusCode = exception.getStatus();
      const response = exception.getResponse();
      const error = HttpStatus[statusCode]
        ? titleCase(HttpStatus[statusCode])
        : exception.name.replace(/Exception$/, '');
      if (typeof response === 'string') return { statusCode, error, message: response };
      const r = response as { message?: unknown; fields?: Record<string, string> };
      const message = Array.isArray(r.message)
        ? r.message.map(String).join('; ')
        : typeof r.message === 'string'
          ? r.message
          : exception.message;
      const out: ApiError = { statusCode, error, message };
      if (r.fields) out.fields = r.fields;
      if (exception instanceof BadRequestException && !out.fields && Array.isArray(r.message)) {
        out.message = r.message.map(String).join('; ');
      }
      return out;
    }
    return {
      statusCode: 500,
      error: 'Internal Server Error',
      message: 'Something went wrong on our side.',
    };
  }
}

function titleCase(constant: string): string {
  return constant
    .toLowerCase()
    .split('_')
    .map((w) => w.charAt(0).toUpperCase() + w.slice(1))
    .join(' ');
}
