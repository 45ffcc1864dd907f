import { afterEach, describe, expect, it, vi } from 'vitest';
import { api, ApiRequestError, SIGNED_OUT_EVENT, UNREACHABLE_EVENT } from './api-client';

/** Finding 7 on the browser side: an outage is "can't reach Loamline", never a sign-out. */
describe('api client', () => {
  afterEach(() => vi.unstubAllGlobals());

  function listen() {
    const seen: string[] = [];
    const on = (e: Event) => seen.push(e.type);
    window.addEventListener(SIGNED_OUT_EVENT, on);
    window.addEventListener(UNREACHABLE_EVENT, on);
    return {
      seen,
      stop: () => {
        window.removeEventListener(SIGNED_OUT_EVENT, on);
        window.removeEventListener(UNREACHABLE_EVENT, on);
      },
    };
  }

  const answer = (status: number, body: string) =>
    vi.stubGlobal(
      'fetch',
      vi.fn(() => Promise.resolve(new Response(body, { status }))),
    );

  it('a 503 (database unreachable) says "can\'t reach Loamline" and does not sign out', async () => {
    answer(503, JSON.stringify({ statusCode: 503, error: 'Service Unavailable', message: 'db' }));
    const events = listen();
    const err = await api('/auth/me').catch((e: unknown) => e);
    events.stop();
    expect(err).toBeInstanceOf(ApiRequestError);
    expect((err as ApiRequestError).status).toBe(503);
    expect((err as ApiRequestError).message).toMatch(/Can't reach Loamline/);
    expect(events.seen).toEqual([UNREACHABLE_EVENT]);
  });

  it('no answer at all (server down) is the same, and a proxy page that is not JSON too', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(() => Promise.reject(new TypeError('Failed to fetch'))),
    );
    const events = listen();
    const down = await api('/bikes').catch((e: unknown) => e);
    answer(502, '<html>Bad gateway</html>');
    const proxy = await api('/bikes').catch((e: unknown) => e);
    events.stop();
    expect((down as ApiRequestError).message).toMatch(/Can't reach Loamline/);
    expect((proxy as ApiRequestError).status).toBe(502);
    expect(events.seen).toEqual([UNREACHABLE_EVENT, UNREACHABLE_EVENT]);
  });

  it('a 401 still reports the end of the session', async () => {
    answer(401, JSON.stringify({ statusCode: 401, error: 'Unauthorized', message: 'Sign in.' }));
    const events = listen();
    await api('/auth/me').catch(() => undefined);
    events.stop();
    expect(events.seen).toEqual([SIGNED_OUT_EVENT]);
  });

  it('a 503 the caller explains (payments down while booking) keeps the server message, no global notice', async () => {
    const message =
      "Online payment isn't available right now, so nothing was booked. Try again in a few minutes.";
    answer(503, JSON.stringify({ statusCode: 503, error: 'Service Unavailable', message }));
    const events = listen();
    const err = await api('/appointments', { body: {}, unavailable: 'caller' }).catch((e: unknown) => e);
    answer(502, '<html>Bad gateway</html>');
    const proxy = await api('/appointments', { body: {}, unavailable: 'caller' }).catch((e: unknown) => e);
    events.stop();
    expect((err as ApiRequestError).status).toBe(503);
    expect((err as ApiRequestError).message).toBe(message);
    // a proxy's page is still "can't reach Loamline"
    expect((proxy as ApiRequestError).message).toMatch(/Can't reach Loamline/);
    expect(events.seen).toEqual([UNREACHABLE_EVENT]);
  });

  it('sends a FormData upload as the browser builds it: same origin, no JSON type, the upload header', async () => {
    const fetch = vi.fn(() =>
      Promise.resolve(new Response(JSON.stringify({ id: 'att-1' }), { status: 201 })),
    );
    vi.stubGlobal('fetch', fetch);
    const form = new FormData();
    form.append('kind', 'photo');
    const out = await api<{ id: string }>('/workshop/appointments/a1/attachments', { form });
    expect(out).toEqual({ id: 'att-1' });
    const [url, init] = fetch.mock.calls[0] as unknown as [string, RequestInit];
    expect(url).toBe('/api/workshop/appointments/a1/attachments');
    expect(init.method).toBe('POST');
    expect(init.credentials).toBe('same-origin');
    expect(init.body).toBe(form);
    expect(init.headers).toEqual({ accept: 'application/json', 'x-loamline-upload': '1' });
  });
});
