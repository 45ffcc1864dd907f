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
import { DomainError } from '../errors/domain-errors';

/**
 * Turns every error into the one shape of shared-types' `ApiError`. Anything that is not an
 * HttpException is logged and answered as a 500 without internals.
 */
@Catch()
export class ApiExceptionFilter implements ExceptionFilter {
  private readonly logger = new Logger(ApiExceptionFilter.name);

  catch(exception: unknown, host: ArgumentsHost): void {
    const res = host.switchToHttp().getResponse<Response>();
    const body = this.toApiError(exception);
    if (body.statusCode >= 500) this.logger.error(exception);
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
