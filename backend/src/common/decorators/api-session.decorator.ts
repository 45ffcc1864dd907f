import { applyDecorators } from '@nestjs/common';
import { ApiBearerAuth, ApiCookieAuth, ApiUnauthorizedResponse } from '@nestjs/swagger';

/** OpenAPI: the route needs a session, from the `loamline_session` cookie or `Authorization: Bearer`. */
export const ApiSession = (): MethodDecorator & ClassDecorator =>
  applyDecorators(
    ApiCookieAuth(),
    ApiBearerAuth(),
    ApiUnauthorizedResponse({ description: 'Signed out, or the session expired or is invalid.' }),
  );
