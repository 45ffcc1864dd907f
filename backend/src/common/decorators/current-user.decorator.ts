import { createParamDecorator, type ExecutionContext, UnauthorizedException } from '@nestjs/common';
import type { AuthUser } from '@loamline/shared-types';

/** The signed-in user the session strategy loaded from the database for this request. */
export interface RequestUser extends AuthUser {
  /** the user's current token version (sessions signed with another one are refused) */
  tokenVersion: number;
}

/** The signed-in user of the request (on a route the global guard protects). */
export const CurrentUser = createParamDecorator((_data: unknown, ctx: ExecutionContext): RequestUser => {
  const user = ctx.switchToHttp().getRequest<{ user?: RequestUser }>().user;
  if (!user) throw new UnauthorizedException('Sign in to continue.');
  return user;
});
