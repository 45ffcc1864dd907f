import { UnauthorizedException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { Reflector } from '@nestjs/core';
import { JwtModule, JwtService } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { Test } from '@nestjs/testing';
import { SESSION_COOKIE } from '@loamline/shared-types';
import { Public } from '../common/decorators/public.decorator';
import { httpContext } from '../common/guards/execution-context.fake';
import type { User } from '../users/user.entity';
import { UsersService } from '../users/users.service';
import { JwtAuthGuard } from './jwt-auth.guard';
import { JwtStrategy } from './jwt.strategy';
import { SessionStore } from './session-store';
import { SessionService } from './session.service';

const SECRET = 'unit-test-secret-of-at-least-32-characters';
const TTL = 1800;

class Thing {
  @Public()
  open(): void {}
  closed(): void {}
}

/** The collaborator faked: a users table of one. */
const alice = {
  id: 'u-alice',
  email: 'alice@example.test',
  name: 'Alice',
  role: 'rider',
  shopId: null,
  tokenVersion: 2,
};

describe('JwtAuthGuard (with the real passport-jwt strategy, users faked)', () => {
  let guard: JwtAuthGuard;
  let jwt: JwtService;
  const SID = '0b9d7a52-3f1e-4c8a-9d6b-2a4f5e6c7d8e';
  /** The session store faked: alice has one live session, SID. */
  const findUser = jest.fn((id: string, sid: string, tv: number) =>
    Promise.resolve(
      id === alice.id && sid === SID && tv === alice.tokenVersion ? ({ ...alice } as unknown as User) : null,
    ),
  );

  beforeAll(async () => {
    const config = { getOrThrow: () => ({ jwtSecret: SECRET, sessionTtlSeconds: TTL }) };
    const moduleRef = await Test.createTestingModule({
      imports: [
        PassportModule,
        JwtModule.register({ secret: SECRET, signOptions: { algorithm: 'HS256', expiresIn: TTL } }),
      ],
      providers: [
        JwtStrategy,
        SessionService,
        JwtAuthGuard,
        Reflector,
        { provide: ConfigService, useValue: config },
        { provide: SessionStore, useValue: { findUser, extend: () => Promise.resolve() } },
        {
          provide: UsersService,
          useValue: {
            toAuthUser: (u: typeof alice) => ({
              id: u.id,
              email: u.email,
              name: u.name,
              role: u.role,
              shopId: u.shopId,
            }),
          },
        },
      ],
    }).compile();
    guard = moduleRef.get(JwtAuthGuard);
    jwt = moduleRef.get(JwtService);
  });
  beforeEach(() => findUser.mockClear());

  const now = () => Math.floor(Date.now() / 1000);
  const request = (headers: Record<string, string> = {}, cookies: Record<string, string> = {}) =>
    ({ headers, cookies, secure: false }) as Record<string, unknown>;
  const response = () => ({ cookie: jest.fn() });
  const ctx = (method: 'open' | 'closed', req: object, res: object = response()) =>
    httpContext(Thing, Thing.prototype[method], req, res);

  it('lets a @Public route through without a token and without touching the users', async () => {
    expect(await guard.canActivate(ctx('open', request()))).toBe(true);
    expect(findUser).not.toHaveBeenCalled();
  });

  it('refuses a protected route without a token (401)', async () => {
    await expect(guard.canActivate(ctx('closed', request()))).rejects.toBeInstanceOf(UnauthorizedException);
  });

  it('accepts a Bearer token, loads the user and puts it on the request', async () => {
    const req = request({ authorization: `Bearer ${jwt.sign({ sub: alice.id, sid: SID, tv: 2 })}` });
    const res = response();
    await expect(guard.canActivate(ctx('closed', req, res))).resolves.toBe(true);
    expect(findUser).toHaveBeenCalledWith(alice.id, SID, 2);
    expect(req.user).toEqual({
      id: alice.id,
      email: alice.email,
      name: 'Alice',
      role: 'rider',
      shopId: null,
      tokenVersion: 2,
    });
    expect(res.cookie).not.toHaveBeenCalled();
  });

  it('renews a cookie session past half its lifetime, with httpOnly and SameSite=Lax', async () => {
    const claims = { sub: alice.id, sid: SID, tv: 2, iat: now() - 1000, exp: now() + 800 };
    const old = new JwtService({ secret: SECRET }).sign(claims, { algorithm: 'HS256' });
    const res = response();
    await expect(guard.canActivate(ctx('closed', request({}, { [SESSION_COOKIE]: old }), res))).resolves.toBe(
      true,
    );
    expect(res.cookie).toHaveBeenCalledWith(
      SESSION_COOKIE,
      expect.any(String),
      expect.objectContaining({ httpOnly: true, sameSite: 'lax', secure: false, maxAge: TTL * 1000 }),
    );
  });

  it('refuses a token of an older password (token version) and of an unknown user', async () => {
    const stale = request({ authorization: `Bearer ${jwt.sign({ sub: alice.id, sid: SID, tv: 1 })}` });
    await expect(guard.canActivate(ctx('closed', stale))).rejects.toBeInstanceOf(UnauthorizedException);
    const ghost = request({ authorization: `Bearer ${jwt.sign({ sub: 'u-ghost', sid: SID, tv: 0 })}` });
    await expect(guard.canActivate(ctx('closed', ghost))).rejects.toBeInstanceOf(UnauthorizedException);
  });

  it('refuses a token without a session id, and one whose session is not live (signed out)', async () => {
    const noSid = request({ authorization: `Bearer ${jwt.sign({ sub: alice.id, tv: 2 })}` });
    await expect(guard.canActivate(ctx('closed', noSid))).rejects.toBeInstanceOf(UnauthorizedException);
    const otherSid = jwt.sign({ sub: alice.id, sid: '1b9d7a52-3f1e-4c8a-9d6b-2a4f5e6c7d8e', tv: 2 });
    const ended = request({ authorization: `Bearer ${otherSid}` });
    await expect(guard.canActivate(ctx('closed', ended))).rejects.toBeInstanceOf(UnauthorizedException);
  });

  it('refuses alg "none" without asking for the user', async () => {
    const b64 = (o: object) => Buffer.from(JSON.stringify(o)).toString('base64url');
    const none = `${b64({ alg: 'none', typ: 'JWT' })}.${b64({ sub: alice.id, sid: SID, tv: 2, iat: now(), exp: now() + 60 })}.`;
    await expect(
      guard.canActivate(ctx('closed', request({ authorization: `Bearer ${none}` }))),
    ).rejects.toBeInstanceOf(UnauthorizedException);
    expect(findUser).not.toHaveBeenCalled();
  });
});
