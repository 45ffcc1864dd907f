import { SetMetadata } from '@nestjs/common';
import type { Role } from '@loamline/shared-types';

export const ROLES_KEY = 'loamline:roles';

/** Only signed-in users with one of these roles may use the route (403 for the others). */
export const Roles = (...roles: Role[]): MethodDecorator & ClassDecorator => SetMetadata(ROLES_KEY, roles);
