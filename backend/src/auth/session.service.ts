import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { JwtService } from '@nestjs/jwt';
import type { CookieOptions, Request, Response } from 'express';
import type { EntityManager } from 'typeorm';
import { SESSION_COOKIE } from '@loamline/shared-types';
import type { AuthConfig } from '../config/app.config';
import { SessionStore } from './session-store';

/**
 * What a session token says: who (`sub`), which session (`sid`, a row in user_sessions that
 * sign-out revokes) and which password generation (`tv`) it was signed for.
 */
export interface SessionClaims {
  sub: string;
  sid: string;
  tv: number;
  iat: number;
  exp: number;
}

/** Reads the session token of a request: the cookie first, then `Authorization: Bearer`. */
export function sessionTokenOf(req: Request): { token: string; fromCookie: boolean } | null {
  const cookies = req.cookies as Record<string, unknown> | undefined;
  const cookie = cookies?.[SESSION_COOKIE];
  if (typeof cookie === 'string' && cookie.length > 0) return { token: cookie, fromCookie: true };
  const m = /^Bearer\s+(\S+)$/i.exec(req.headers.authorization ?? '');
  return m ? { token: m[1], fromCookie: false } : null;
}

/**
 * Issues session tokens (HS256 JWTs, short-lived) for sessions kept in the database, and puts
 * them in the httpOnly, SameSite=Lax cookie — Secure when the request came over https.
 */
@Injectable()
export class SessionService {
  readonly ttlSeconds: number;

  constructor(
    private readonly jwt: JwtService,
    private readonly store: SessionStore,
    config: ConfigService,
  ) {
    this.ttlSeconds = config.getOrThrow<AuthConfig>('auth').sessionTtlSeconds;
  }

  /** Starts a session row and returns its token (for the cookie, or for Bearer clients). */
  async start(
    user: { id: string; tokenVersion: number },
    manager?: EntityManager,
  ): Promise<{ token: string; sessionId: string }> {
    const sessionId = await this.store.start(user.id, this.ttlSeconds, manager);
    return { token: this.issue(user, sessionId), sessionId };
  }

  issue(user: { id: string; tokenVersion: number }, sessionId: string): string {
    return this.jwt.sign({ sub: user.id, sid: sessionId, tv: user.tokenVersion });
  }

  /** Signs the user in on this response: a new session, its token in the cookie; returns the token. */
  async signIn(req: Request, res: Response, user: { id: string; tokenVersion: number }): Promise<string> {
    const { token } = await this.start(user);
    this.setCookie(req, res, token);
    return token;
  }

  /** A fresh token for the same session (silent renewal); the row's expiry moves in the background. */
  renew(req: Request, res: Response, user: { id: string; tokenVersion: number }, sessionId: string): void {
    this.setCookie(req, res, this.issue(user, sessionId));
    this.store.extend(sessionId, this.ttlSeconds).catch(() => undefined);
  }

  /** Ends the request's session on the server (when its token is ours) and clears the cookie. */
  async signOut(req: Request, res: Response): Promise<void> {
    const found = sessionTokenOf(req);
    if (found) {
      const claims = this.verify(found.token);
      if (claims) await this.store.revoke(claims.sid);
    }
    res.clearCookie(SESSION_COOKIE, this.cookieOptions(req));
  }

  /** Ends every session of the user (all browsers and clients) and clears this cookie. */
  async signOutEverywhere(req: Request, res: Response, userId: string): Promise<void> {
    await this.store.revokeAll(userId);
    res.clearCookie(SESSION_COOKIE, this.cookieOptions(req));
  }

  /** True when more than half of the token's lifetime has passed: time to hand out a new one. */
  isDueForRenewal(claims: Pick<SessionClaims, 'iat' | 'exp'>, nowSeconds = Date.now() / 1000): boolean {
    return nowSeconds - claims.iat > (claims.exp - claims.iat) / 2;
  }

  private verify(token: string): SessionClaims | null {
    try {
      const c = this.jwt.verify<Partial<SessionClaims>>(token, { algorithms: ['HS256'] });
      return typeof c.sid === 'string' && typeof c.sub === 'string' ? (c as SessionClaims) : null;
    } catch {
      return null;
    }
  }

  private setCookie(req: Request, res: Response, token: string): void {
    res.cookie(SESSION_COOKIE, token, { ...this.cookieOptions(req), maxAge: this.ttlSeconds * 1000 });
  }

  private cookieOptions(req: Request): CookieOptions {
    return { httpOnly: true, sameSite: 'lax', secure: req.secure, path: '/' };
  }
}
