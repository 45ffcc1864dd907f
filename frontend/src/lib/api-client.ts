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

type Json = Record<string, unknown> | unknown[];

/** The one way the app talks to the server: same origin, JSON, cookies, the server's error shape. */
export async function api<T>(path: string, init: { method?: string; body?: Json } = {}): Promise<T> {
  const res = await fetch(`/api${path}`, {
    method: init.method ?? (init.body ? 'POST' : 'GET'),
    credentials: 'same-origin',
    headers: init.body
      ? { 'content-type': 'application/json', accept: 'application/json' }
      : { accept: 'application/json' },
    body: init.body ? JSON.stringify(init.body) : undefined,
  });
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  const data: unknown = text ? JSON.parse(text) : undefined;
  if (!res.ok) {
    const body =
      data && typeof data === 'object' && 'message' in data
        ? (data as ApiError)
        : { statusCode: res.status, error: res.statusText, message: `The server answered ${res.status}.` };
    if (res.status === 401) window.dispatchEvent(new CustomEvent('loamline:signed-out'));
    throw new ApiRequestError(res.status, body);
  }
  return data as T;
}

/** SWR's fetcher: the key is the API path. */
export const apiFetcher = <T>(path: string): Promise<T> => api<T>(path);
