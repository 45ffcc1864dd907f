import type { RequestUser } from './decorators/current-user.decorator';
import { ForbiddenError } from './errors/domain-errors';

/** The shop a signed-in staff member works for; staff see and change only their own shop. */
export function staffShopId(user: RequestUser): string {
  if ((user.role !== 'technician' && user.role !== 'owner') || !user.shopId)
    throw new ForbiddenError('Only the staff of a shop can do that.');
  return user.shopId;
}
