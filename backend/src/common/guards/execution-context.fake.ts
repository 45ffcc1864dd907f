import type { ExecutionContext } from '@nestjs/common';

/** A hand-made HTTP ExecutionContext for guard unit tests (no server involved). */
export function httpContext(
  cls: abstract new (...args: never[]) => unknown,
  handler: (...args: never[]) => unknown,
  req: object,
  res: object = {},
): ExecutionContext {
  const http = { getRequest: () => req, getResponse: () => res, getNext: () => undefined };
  return {
    getClass: () => cls,
    getHandler: () => handler,
    getType: () => 'http',
    getArgs: () => [req, res, undefined],
    getArgByIndex: (i: number) => [req, res, undefined][i],
    switchToHttp: () => http,
    switchToRpc: () => {
      throw new Error('not rpc');
    },
    switchToWs: () => {
      throw new Error('not ws');
    },
  } as unknown as ExecutionContext;
}
