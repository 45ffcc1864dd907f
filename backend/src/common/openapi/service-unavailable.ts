import type { OpenAPIObject } from '@nestjs/swagger';
import { DATABASE_UNAVAILABLE_MESSAGE, RETRY_AFTER_SECONDS } from '../filters/database-errors';

const METHODS = ['get', 'put', 'post', 'delete', 'patch', 'options', 'head', 'trace'] as const;

/**
 * Every operation may answer 503 with `Retry-After` (ApiExceptionFilter): each request passes the
 * session guard, which reads the session's account from the database when a cookie comes with it, and
 * the database, the payment service or a stopped node of the cluster can be away. Said once here for
 * the whole document rather than on each of the controllers; an operation that declares its own 503
 * (the payment routes) keeps its own description.
 */
export function withServiceUnavailable(doc: OpenAPIObject): OpenAPIObject {
  doc.components ??= {};
  doc.components.responses = {
    ...doc.components.responses,
    ServiceUnavailable: {
      description: `A service the answer needs (the database, the payment service) is not reachable just now; try again after Retry-After seconds. Nothing was changed. The body: {"statusCode":503,"error":"Service Unavailable","message":"${DATABASE_UNAVAILABLE_MESSAGE}"} or the payment service's own message.`,
      headers: {
        'Retry-After': {
          description: 'Seconds to wait before trying again (RFC 9110, section 10.2.3)',
          schema: { type: 'integer', example: RETRY_AFTER_SECONDS },
        },
      },
    },
  };
  for (const item of Object.values(doc.paths)) {
    for (const method of METHODS) {
      const op = item[method];
      if (op && !op.responses['503'])
        op.responses['503'] = { $ref: '#/components/responses/ServiceUnavailable' };
    }
  }
  return doc;
}
