import { Injectable, UnauthorizedException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { PassportStrategy } from '@nestjs/passport';
import type { Request } from 'express';
import { Strategy } from 'passport-jwt';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import type { AuthConfig } from '../config/app.config';
import { UsersService } from '../users/users.service';
import { SessionStore } from './session-store';
import { sessionTokenOf, type SessionClaims } from './session.service';

/** The session as the guard left it on the request, for silent renewal. */
export interface SessionRequest extends Request {
  user?: RequestUser;
  sessionToken?: { claims: SessionClaims; fromCookie: boolean };
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

function isClaims(p: unknown): p is SessionClaims {
  const c = p as Partial<SessionClaims> | null;
  return (
    !!c &&
    typeof c.sub === 'string' &&
    typeof c.sid === 'string' &&
    UUID.test(c.sid) &&
    Number.isInteger(c.tv) &&
    typeof c.iat === 'number' &&
    typeof c.exp === 'number'
  );
}

/**
 * Reads the session JWT from the `loamline_session` cookie or an `Authorization: Bearer` header,
 * verifies it with HS256 only (so `alg: none` and every other algorithm is refused), then loads the
 * user and the session from the database on every request: a deleted user, a signed-out session
 * (`sid` revoked) or a token signed before the last password change or "sign out everywhere"
 * (`tv`) is 401.
 */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy, 'jwt') {
  constructor(
    config: ConfigService,
    private readonly users: UsersService,
    private readonly store: SessionStore,
  ) {
    super({
      jwtFromRequest: (req: Request) => sessionTokenOf(req)?.token ?? null,
      secretOrKey: config.getOrThrow<AuthConfig>('auth').jwtSecret,
      algorithms: ['HS256'],
      ignoreExpiration: false,
      passReqToCallback: true,
    });
  }

  async validate(req: SessionRequest, payload: unknown): Promise<RequestUser> {
    if (!isClaims(payload)) throw new UnauthorizedException('Your session is not valid; sign in again.');
    const user = await this.store.findUser(payload.sub, payload.sid, payload.tv);
    if (!user) throw new UnauthorizedException('Your session has ended; sign in again.');
    req.sessionToken = { claims: payload, fromCookie: sessionTokenOf(req)?.fromCookie ?? false };
    return { ...this.users.toAuthUser(user), tokenVersion: user.tokenVersion };
  }
}
