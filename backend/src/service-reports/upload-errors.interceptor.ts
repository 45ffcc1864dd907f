import {
  BadRequestException,
  type CallHandler,
  type ExecutionContext,
  Injectable,
  type NestInterceptor,
  PayloadTooLargeException,
} from '@nestjs/common';
import { catchError, type Observable } from 'rxjs';
import { REPORT_LIMITS } from '@loamline/shared-types';
import { InvalidInputError, TooLargeError } from '../common/errors/domain-errors';

const MB = 1024 * 1024;

/**
 * Put outside multer's FileInterceptor: says what multer's refusals mean in the technician's terms
 * (multer's own are "File too large", "Unexpected field").
 */
@Injectable()
export class UploadErrorsInterceptor implements NestInterceptor {
  intercept(_context: ExecutionContext, next: CallHandler): Observable<unknown> {
    return next.handle().pipe(
      catchError((e: unknown) => {
        if (e instanceof PayloadTooLargeException)
          throw new TooLargeError(
            `The file is larger than ${REPORT_LIMITS.photoMaxBytes / MB} MB, the most a photo may be (a curve's CSV: ${REPORT_LIMITS.curveMaxBytes / MB} MB).`,
            { file: `at most ${REPORT_LIMITS.photoMaxBytes / MB} MB` },
          );
        if (
          e instanceof BadRequestException &&
          /unexpected field|too many|field name|field value|multipart|boundary|unexpected end/i.test(
            e.message,
          )
        )
          throw new InvalidInputError(
            `The upload was not understood (${e.message}): send one file in the form field "file", with "kind" and, for a curve, its settings.`,
            { file: 'send one file in the form field "file"' },
          );
        throw e;
      }),
    );
  }
}

/** multer's limits for the upload route: one file of at most 8 MB and a few short text fields. */
export const UPLOAD_LIMITS = {
  fileSize: REPORT_LIMITS.photoMaxBytes,
  files: 1,
  fields: 10,
  fieldSize: 1000,
  parts: 12,
  headerPairs: 50,
};
