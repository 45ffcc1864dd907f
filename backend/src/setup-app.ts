import type { INestApplication, NestApplicationOptions } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import cookieParser from 'cookie-parser';
import type { Application, RequestHandler } from 'express';
import { ApiExceptionFilter } from './common/filters/api-exception.filter';
import { withServiceUnavailable } from './common/openapi/service-unavailable';
import { createValidationPipe } from './common/pipes/validation.pipe';
import { bodyErrors, jsonBody } from './common/security/json-body';
import { apiDocsHeaders, noStore, paymentOrigins, securityHeaders } from './common/security/security-headers';
import { frontendFiles } from './common/security/static-files';
import type { AppConfig, PaymentsConfig } from './config/app.config';

/**
 * Options every instance is created with (main.ts and the API tests): Nest's own body parsers are
 * off, because setupApp installs the one JSON parser with its size and depth limits (no forms).
 */
export const APP_OPTIONS: NestApplicationOptions = { bodyParser: false };

/** Answers 404 for the front end's source maps unless SERVE_SOURCE_MAPS (or not production). */
const hideSourceMaps: RequestHandler = (req, res, next) => {
  if (req.method === 'GET' && !req.path.startsWith('/api/') && req.path.endsWith('.map')) {
    res.status(404).type('text/plain').send('Not found');
    return;
  }
  next();
};

/**
 * Everything main.ts does to the app besides listening, shared with the API tests so that they
 * exercise the same pipeline: proxy trust, security headers, the built front end's files, the JSON
 * body parser, the /api prefix, cookies, the global pipe and error shape, OpenAPI (when configured).
 */
export function setupApp(app: INestApplication): INestApplication {
  const config = app.get(ConfigService).getOrThrow<AppConfig>('app');
  const express = app.getHttpAdapter().getInstance() as Application;
  express.disable('x-powered-by');
  // No ETag on what the app sends itself (API answers; static files keep serve-static's own): every
  // API answer is `no-store`, so a tag could never be revalidated, and hashing each body cost about
  // as much as the compute route's serialization (docs/performance.md).
  express.set('etag', false);
  // Off unless TRUST_PROXY names the proxy: otherwise anyone could pick their own req.ip (and
  // with it a fresh rate-limit budget) by sending X-Forwarded-For.
  express.set('trust proxy', config.trustProxy);

  const payments = app.get(ConfigService).getOrThrow<PaymentsConfig>('payments');
  app.use(
    securityHeaders({
      https: config.url.startsWith('https:'),
      paymentOrigins: paymentOrigins(payments.scriptUrl),
    }),
  );
  if (!config.serveSourceMaps) app.use(hideSourceMaps);
  // the built front end, precompressed (brotli, gzip) with its cache headers; deep links get index.html
  app.use(frontendFiles(config.frontendDist));
  app.use('/api', noStore);
  // when a password-reset request arrived, before the guards (the shared rate limit writes to the
  // database): its answer's timing floor counts from here (AuthService.requestPasswordReset)
  const stampArrival: RequestHandler = (_req, res, next) => {
    res.locals.receivedAt = performance.now();
    next();
  };
  app.use('/api/auth/password-reset', stampArrival);
  app.use('/api', ...jsonBody());
  app.use(bodyErrors);
  app.setGlobalPrefix('api');
  app.use(cookieParser());
  app.useGlobalPipes(createValidationPipe());
  app.useGlobalFilters(new ApiExceptionFilter());
  app.enableShutdownHooks();
  if (config.apiDocs) {
    app.use('/api/docs', apiDocsHeaders());
    const doc = new DocumentBuilder()
      .setTitle('Loamline API')
      .setDescription('Suspension baselines, bookings and service reports.')
      .setVersion('0.1.0')
      .addCookieAuth('loamline_session')
      .addBearerAuth()
      .build();
    SwaggerModule.setup(
      'api/docs',
      app,
      () => withServiceUnavailable(SwaggerModule.createDocument(app, doc)),
      {
        jsonDocumentUrl: 'api/docs-json',
      },
    );
  }
  return app;
}
