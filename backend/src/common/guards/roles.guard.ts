import {
  type CanActivate,
  type ExecutionContext,
  ForbiddenException,
  Injectable,
  UnauthorizedException,
} from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import type { Role } from '@loamline/shared-types';
import type { RequestUser } from '../decorators/current-user.decorator';
import { IS_PUBLIC_KEY } from '../decorators/public.decorator';
import { ROLES_KEY } from '../decorators/roles.decorator';

const STAFF: readonly Role[] = ['technician', 'owner'];

/**
 * The second global guard: runs after the session guard has put the user on the request and
 * refuses (403) a user whose role the route's `@Roles()` does not list. Staff roles also need a shop.
 */
@Injectable()
export class RolesGuard implements CanActivate {
  constructor(private readonly reflector: Reflector) {}

  canActivate(context: ExecutionContext): boolean {
    const targets = [context.getHandler(), context.getClass()];
    const roles = this.reflector.getAllAndOverride<Role[] | undefined>(ROLES_KEY, targets);
    if (!roles || roles.length === 0) return true;
    if (this.reflector.getAllAndOverride<boolean | undefined>(IS_PUBLIC_KEY, targets)) return true;
    const user = context.switchToHttp().getRequest<{ user?: RequestUser }>().user;
    if (!user) throw new UnauthorizedException('Sign in to continue.');
    if (!roles.includes(user.role)) throw new ForbiddenException(forbiddenMessage(roles));
    if (STAFF.includes(user.role) && !user.shopId) {
      throw new ForbiddenException('Your account does not belong to a shop.');
    }
    return true;
  }
}

function forbiddenMessage(roles: Role[]): string {
  if (roles.every((r) => r === 'owner')) return 'Only the shop owner may do this.';
  if (roles.every((r) => STAFF.includes(r))) return 'This is for shop staff only.';
  return 'Your account may not do this.';
}
