import { ForbiddenException, UnauthorizedException } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import type { RequestUser } from '../decorators/current-user.decorator';
import { Public } from '../decorators/public.decorator';
import { Roles } from '../decorators/roles.decorator';
import { httpContext } from './execution-context.fake';
import { RolesGuard } from './roles.guard';

@Roles('technician', 'owner')
class WorkshopThing {
  list(): void {}
  @Roles('owner')
  invite(): void {}
}

class OpenThing {
  read(): void {}
  @Public()
  @Roles('owner')
  odd(): void {}
}

const user = (
  role: RequestUser['role'],
  shopId: string | null = role === 'rider' ? null : 'shop-1',
): RequestUser => ({
  id: 'u1',
  email: 'u1@example.test',
  name: 'U',
  role,
  shopId,
  tokenVersion: 0,
});

describe('RolesGuard', () => {
  const guard = new RolesGuard(new Reflector());
  const run = (cls: abstract new () => unknown, method: string, u?: RequestUser) => {
    const handler = (cls.prototype as Record<string, () => void>)[method];
    return () => guard.canActivate(httpContext(cls, handler, { user: u }));
  };

  it('lets any signed-in user through a route without @Roles', () => {
    expect(run(OpenThing, 'read', user('rider'))()).toBe(true);
  });

  it('uses the class roles: staff pass, a rider gets 403', () => {
    expect(run(WorkshopThing, 'list', user('technician'))()).toBe(true);
    expect(run(WorkshopThing, 'list', user('owner'))()).toBe(true);
    expect(run(WorkshopThing, 'list', user('rider'))).toThrow(ForbiddenException);
  });

  it('lets a method narrow the class roles: only the owner may invite', () => {
    expect(run(WorkshopThing, 'invite', user('owner'))()).toBe(true);
    expect(run(WorkshopThing, 'invite', user('technician'))).toThrow('Only the shop owner may do this.');
  });

  it('refuses staff without a shop', () => {
    expect(run(WorkshopThing, 'list', user('technician', null))).toThrow(ForbiddenException);
  });

  it('answers 401 (not 403) when no user is on the request', () => {
    expect(run(WorkshopThing, 'list', undefined)).toThrow(UnauthorizedException);
  });

  it('does not apply roles to a @Public route', () => {
    expect(run(OpenThing, 'odd', undefined)()).toBe(true);
  });
});
