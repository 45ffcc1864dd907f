import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { JwtService } from '@nestjs/jwt';
import type { CookieOptions, Request, Response } from 'express';
import { SESSION_COOKIE } from '@loamline/shared-types';
import type { AuthConfig } from '../config/app.config';

/** What a session token says: who (`sub`) and which password generation (`tv`) it was signed for. */
export interface SessionClaims {
  sub: string;
  tv: number;
  iat: number;
  exp: number;
}

/**
 * Issues session tokens (HS256 JWTs, short-lived) and puts them in the httpOnly, SameSite=Lax
 * cookie — Secure when the request came over https.
 */
@Injectable()
export class SessionService {
  readonly ttlSeconds: number;

  constructor(
    private readonly jwt: JwtService,
    config: ConfigService,
  ) {
    this.ttlSeconds = config.getOrThrow<AuthConfig>('auth').sessionTtlSeconds;
  }

  issue(user: { id: string; tokenVersion: number }): string {
    return this.jwt.sign({ sub: user.id, tv: user.tokenVersion });
  }

  /** Signs the user in on this response: a fresh token in the cookie; returns it for Bearer clients. */
  signIn(req: Request, res: Response, user: { id: string; tokenVersion: number }): string {
    const token = this.issue(user);
    res.cookie(SESSION_COOKIE, token, { ...this.cookieOptions(req), maxAge: this.ttlSeconds * 1000 });
    return token;
  }

  signOut(req: Request, res: Response): void {
    res.clearCookie(SESSION_COOKIE, this.cookieOptions(req));
  }

  /** True when more than half of the token's lifetime has passed: time to hand out a new one. */
  isDueForRenewal(claims: Pick<SessionClaims, 'iat' | 'exp'>, nowSeconds = Date.now() / 1000): boolean {
    return nowSeconds - claims.iat > (claims.exp - claims.iat) / 2;
  }

  private cookieOptions(req: Request): CookieOptions {
    return { httpOnly: true, sameSite: 'lax', secure: req.secure, path: '/' };
  }
}
