import type { INestApplication } from '@nestjs/common';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import cookieParser from 'cookie-parser';
import { ApiExceptionFilter } from './common/filters/api-exception.filter';
import { createValidationPipe } from './common/pipes/validation.pipe';

/**
 * Everything main.ts does to the app besides listening, shared with the API tests so that they
 * exercise the same pipeline: the /api prefix, cookies, the global pipe and error shape, OpenAPI.
 */
export function setupApp(app: INestApplication): INestApplication {
  app.setGlobalPrefix('api');
  app.use(cookieParser());
  app.useGlobalPipes(createValidationPipe());
  app.useGlobalFilters(new ApiExceptionFilter());
  app.enableShutdownHooks();
  const doc = new DocumentBuilder()
    .setTitle('Loamline API')
    .setDescription('Suspension baselines, bookings and service reports.')
    .setVersion('0.1.0')
    .addCookieAuth('loamline_session')
    .addBearerAuth()
    .build();
  SwaggerModule.setup('api/docs', app, () => SwaggerModule.createDocument(app, doc), {
    jsonDocumentUrl: 'api/docs-json',
  });
  return app;
}
