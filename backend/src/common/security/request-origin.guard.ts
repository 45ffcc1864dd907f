import {
  type CanActivate,
  type ExecutionContext,
  ForbiddenException,
  Injectable,
  SetMetadata,
  UnsupportedMediaTypeException,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { Reflector } from '@nestjs/core';
import type { Request } from 'express';
import type { AppConfig } from '../../config/app.config';

export const CROSS_SITE_ALLOWED_KEY = 'loamline:crossSiteAllowed';

/**
 * Opts a route out of the JSON-only and same-origin rules: only for callers that prove who they
 * are another way and never ride on a browser's cookie — the payment provider's signed webhook
 * (POST /api/payments/webhook) is meant to be the one. Give the reason, e.g.
 * `@CrossSiteAllowed('signed by the payment provider')`.
 */
export const CrossSiteAllowed = (reason: string): MethodDecorator & ClassDecorator =>
  SetMetadata(CROSS_SITE_ALLOWED_KEY, reason);

export const MULTIPART_ALLOWED_KEY = 'loamline:multipartAllowed';

/**
 * Lets one route take a `multipart/form-data` body (a file upload) besides JSON. Only the 415 rule
 * is relaxed, and only for multipart: the same-origin rule still holds, so a form posted from
 * another site is refused with 403 as before. Give the reason, e.g.
 * `@MultipartAllowed('photo and curve uploads')`.
 */
export const MultipartAllowed = (reason: string): MethodDecorator =>
  SetMetadata(MULTIPART_ALLOWED_KEY, reason);

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * The cross-site request forgery defence (docs/security.md), a global guard on every route that
 * changes state (any method but GET, HEAD, OPTIONS):
 *
 * 1. A body must be JSON (`Content-Type: application/json`), else 415 (a route marked
 *    `@MultipartAllowed` also takes `multipart/form-data`, and nothing else). HTML forms can only send
 *    urlencoded, multipart or text/plain, and a cross-origin `fetch` with JSON needs a CORS
 *    preflight, which this server never grants.
 * 2. A browser's `Sec-Fetch-Site` must be `same-origin` (or `none`: typed by the user), and an
 *    `Origin` header must be one of the trusted origins (APP_URL's, plus TRUSTED_ORIGINS), else
 *    403. Another port on the same host is same-site but not same-origin, and is refused.
 *
 * A request with neither header is let through: browsers send `Origin` on every cross-origin
 * POST and `Sec-Fetch-Site` on all requests, so such a request comes from curl, a test or another
 * server, which cannot carry a rider's cookie anyway (an accepted risk, docs/security.md).
 */
@Injectable()
export class RequestOriginGuard implements CanActivate {
  private readonly trusted: Set<string>;

  constructor(
    private readonly reflector: Reflector,
    config: ConfigService,
  ) {
    this.trusted = new Set(config.getOrThrow<AppConfig>('app').trustedOrigins);
  }

  canActivate(context: ExecutionContext): boolean {
    if (context.getType() !== 'http') return true;
    const req = context.switchToHttp().getRequest<Request>();
    if (SAFE_METHODS.has(req.method)) return true;
    const exempt = this.reflector.getAllAndOverride<string | undefined>(CROSS_SITE_ALLOWED_KEY, [
      context.getHandler(),
      context.getClass(),
    ]);
    if (exempt) return true;

    const type = req.headers['content-type'];
    const hasBody =
      type !== undefined ||
      Number(req.headers['content-length'] ?? 0) > 0 ||
      !!req.headers['transfer-encoding'];
    const multipart =
      isMultipart(type) &&
      !!this.reflector.get<string | undefined>(MULTIPART_ALLOWED_KEY, context.getHandler());
    if (hasBody && !isJson(type) && !multipart) {
      throw new UnsupportedMediaTypeException(
        'Send the request body as JSON (Content-Type: application/json).',
      );
    }

    const site = req.headers['sec-fetch-site'];
    if (typeof site === 'string' && site !== 'same-origin' && site !== 'none') throw foreign();
    const origin = req.headers.origin;
    if (typeof origin === 'string' && !this.trusted.has(origin)) throw foreign();
    return true;
  }
}

function isJson(type: string | undefined): boolean {
  if (!type) return false;
  const essence = type.split(';')[0].trim().toLowerCase();
  return essence === 'application/json';
}

function isMultipart(type: string | undefined): boolean {
  return !!type && type.split(';')[0].trim().toLowerCase() === 'multipart/form-data';
}

const foreign = (): ForbiddenException =>
  new ForbiddenException(
    'This request came from another site; Loamline only accepts changes from its own pages.',
  );
