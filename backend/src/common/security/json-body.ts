import type { NextFunction, Request, RequestHandler, Response } from 'express';
import { json } from 'express';
import type { ApiError } from '@loamline/shared-types';

/** Deepest nesting of objects and arrays a request body may have (the deepest DTO needs 4). */
export const MAX_JSON_DEPTH = 32;
/** Largest JSON body accepted. */
export const MAX_JSON_BYTES = '100kb';

/** How deep a parsed JSON value nests, walked without recursion; stops once past `limit`. */
export function jsonDepthExceeds(value: unknown, limit: number): boolean {
  const stack: [unknown, number][] = [[value, 1]];
  while (stack.length > 0) {
    const [v, depth] = stack.pop()!;
    if (v === null || typeof v !== 'object') continue;
    if (depth > limit) return true;
    for (const child of Array.isArray(v) ? v : Object.values(v as Record<string, unknown>)) {
      if (child !== null && typeof child === 'object') stack.push([child, depth + 1]);
    }
  }
  return false;
}

const apiError = (res: Response, statusCode: number, error: string, message: string): void => {
  const body: ApiError = { statusCode, error, message };
  res.status(statusCode).json(body);
};

/**
 * The JSON body parser of the app (Nest's own is off, see APP_OPTIONS in setup-app.ts): JSON only
 * (no urlencoded forms), at most MAX_JSON_BYTES, the raw bytes kept on `req.rawBody` for signed
 * webhooks, and a body nested deeper than MAX_JSON_DEPTH refused with 400 before any validation
 * code recurses into it (which used to end in a stack overflow, a 500 and a flood of log lines).
 * Malformed or oversized bodies get the API's error shape, without logging.
 */
export function jsonBody(): RequestHandler[] {
  const parse = json({
    limit: MAX_JSON_BYTES,
    verify: (req, _res, buf) => {
      (req as Request & { rawBody?: Buffer }).rawBody = buf;
    },
  });
  const depth: RequestHandler = (req, res, next) => {
    if (jsonDepthExceeds(req.body, MAX_JSON_DEPTH)) {
      apiError(res, 400, 'Bad Request', `The JSON body nests deeper than ${MAX_JSON_DEPTH} levels.`);
      return;
    }
    next();
  };
  return [parse, depth];
}

/** Turns body-parser's errors (malformed JSON, too large, bad charset) into the API's error shape. */
export function bodyErrors(err: unknown, _req: Request, res: Response, next: NextFunction): void {
  const e = err as { type?: unknown; status?: unknown } | null;
  if (
    !e ||
    typeof e.type !== 'string' ||
    (!e.type.startsWith('entity.') && !e.type.startsWith('charset.') && !e.type.startsWith('encoding.'))
  ) {
    next(err);
    return;
  }
  const status = typeof e.status === 'number' ? e.status : 400;
  if (status === 413) apiError(res, 413, 'Payload Too Large', `The body is larger than ${MAX_JSON_BYTES}.`);
  else if (status === 415)
    apiError(res, 415, 'Unsupported Media Type', 'The body encoding is not supported.');
  else apiError(res, 400, 'Bad Request', 'The body is not valid JSON.');
}
