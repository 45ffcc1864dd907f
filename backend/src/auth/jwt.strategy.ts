import { Injectable, UnauthorizedException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { PassportStrategy } from '@nestjs/passport';
import type { Request } from 'express';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { SESSION_COOKIE } from '@loamline/shared-types';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import type { AuthConfig } from '../config/app.config';
import { UsersService } from '../users/users.service';
import type { SessionClaims } from './session.service';

/** The session as the guard left it on the request, for silent renewal. */
export interface SessionRequest extends Request {
  user?: RequestUser;
  sessionToken?: { claims: SessionClaims; fromCookie: boolean };
}

const fromCookie = (req: Request): string | null => {
  const cookies = req.cookies as Record<string, unknown> | undefined;
  const token = cookies?.[SESSION_COOKIE];
  return typeof token === 'string' && token.length > 0 ? token : null;
};

const fromBearer = ExtractJwt.fromAuthHeaderAsBearerToken();

function isClaims(p: unknown): p is SessionClaims {
  const c = p as Partial<SessionClaims> | null;
  return (
    !!c &&
    typeof c.sub === 'string' &&
    Number.isInteger(c.tv) &&
    typeof c.iat === 'number' &&
    typeof c.exp === 'number'
  );
}

/**
 * Reads the session JWT from the `loamline_session` cookie or an `Authorization: Bearer` header,
 * verifies it with HS256 only (so `alg: none` and every other algorithm is refused), then loads the
 * user from the database on every request: a deleted user, or a token signed before the last
 * password change, is 401.
 */
@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy, 'jwt') {
  constructor(
    config: ConfigService,
    private readonly users: UsersService,
  ) {
    super({
      jwtFromRequest: (req: Request) => fromCookie(req) ?? fromBearer(req),
      secretOrKey: config.getOrThrow<AuthConfig>('auth').jwtSecret,
      algorithms: ['HS256'],
      ignoreExpiration: false,
      passReqToCallback: true,
    });
  }

  async validate(req: SessionRequest, payload: unknown): Promise<RequestUser> {
    if (!isClaims(payload)) throw new UnauthorizedException('Your session is not valid; sign in again.');
    const user = await this.users.findById(payload.sub);
    if (!user || user.tokenVersion !== payload.tv) {
      throw new UnauthorizedException('Your session has ended; sign in again.');
    }
    req.sessionToken = { claims: payload, fromCookie: fromCookie(req) !== null };
    return { ...this.users.toAuthUser(user), tokenVersion: user.tokenVersion };
  }
}
