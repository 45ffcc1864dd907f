import type { ApiError } from '@loamline/shared-types';

/** An error answered by the API, carrying the server's message and the fields it named. */
export class ApiRequestError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiError,
  ) {
    super(body.message);
    this.name = 'ApiRequestError';
  }
}

/** Dispatched on every 401: the session ended (features/auth/components/signed-out-notice.tsx). */
export const SIGNED_OUT_EVENT = 'loamline:signed-out';
/**
 * Dispatched when the server cannot be reached or says it cannot reach its database (no answer,
 * 502, 503, 504): the app says "can't reach Loamline" and keeps the rider signed in
 * (components/ui/unreachable-notice.tsx).
 */
export const UNREACHABLE_EVENT = 'loamline:unreachable';

const UNREACHABLE_MESSAGE = "Can't reach Loamline just now. You are still signed in; try again in a moment.";

type Json = Record<string, unknown> | unknown[];

function parse(text: string): unknown {
  try {
    return text ? JSON.parse(text) : undefined;
  } catch {
    return undefined; // e.g. a proxy's HTML error page
  }
}

export interface ApiInit {
  method?: string;
  body?: Json;
  /**
   * A multipart upload (files): sent as the browser builds it (it sets the boundary), never with
   * `body`. Same origin and credentials as JSON; `x-loamline-upload: 1` marks it as the app's own
   * script (a cross-site HTML form cannot set a header, and a cross-origin fetch with one needs a
   * preflight the server never grants). Only the upload routes take it.
   */
  form?: FormData;
  /**
   * `caller`: a 503 that carries the server's error shape is the caller's to explain (e.g. the
   * booking when the payment service is down: nothing was booked) — its message is kept and the
   * global "can't reach Loamline" notice stays quiet. No answer, 502 and 504 stay global.
   */
  unavailable?: 'global' | 'caller';
}

/** The one way the app talks to the server: same origin, JSON, cookies, the server's error shape. */
export async function api<T>(path: string, init: ApiInit = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(`/api${path}`, {
      method: init.method ?? (init.body || init.form ? 'POST' : 'GET'),
      credentials: 'same-origin',
      headers: init.form
        ? { accept: 'application/json', 'x-loamline-upload': '1' }
        : init.body
          ? { 'content-type': 'application/json', accept: 'application/json' }
          : { accept: 'application/json' },
      body: init.form ?? (init.body ? JSON.stringify(init.body) : undefined),
    });
  } catch {
    window.dispatchEvent(new CustomEvent(UNREACHABLE_EVENT));
    throw new ApiRequestError(0, { statusCode: 0, error: 'Network Error', message: UNREACHABLE_MESSAGE });
  }
  if (res.status === 204) return undefined as T;
  const data = parse(await res.text());
  if (!res.ok) {
    const shaped = !!data && typeof data === 'object' && 'message' in data;
    const callerExplains = res.status === 503 && shaped && init.unavailable === 'caller';
    const unreachable = !callerExplains && (res.status === 502 || res.status === 503 || res.status === 504);
    const body =
      shaped && !unreachable
        ? (data as ApiError)
        : {
            statusCode: res.status,
            error: res.statusText,
            message: unreachable ? UNREACHABLE_MESSAGE : `The server answered ${res.status}.`,
          };
    if (res.status === 401) window.dispatchEvent(new CustomEvent(SIGNED_OUT_EVENT));
    if (unreachable) window.dispatchEvent(new CustomEvent(UNREACHABLE_EVENT));
    throw new ApiRequestError(res.status, body);
  }
  return data as T;
}

/** SWR's fetcher: the key is the API path. */
export const apiFetcher = <T>(path: string): Promise<T> => api<T>(path);
