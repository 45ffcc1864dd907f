import { SetMetadata } from '@nestjs/common';

export const IS_PUBLIC_KEY = 'loamline:isPublic';

/** Opts a route (or a whole controller) out of the global sign-in guard. */
export const Public = (): MethodDecorator & ClassDecorator => SetMetadata(IS_PUBLIC_KEY, true);
