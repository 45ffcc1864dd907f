import type { Response } from 'supertest';
import { SESSION_COOKIE } from '@loamline/shared-types';

export interface SetCookie {
  name: string;
  value: string;
  /** `name=value` for a request's `Cookie` header */
  pair: string;
  /** the attributes as sent, e.g. `HttpOnly`, `SameSite=Lax`, `Max-Age=1800` */
  flags: string[];
}

/** The `Set-Cookie` headers of a response, split into name, value and attributes (RFC 6265 §4.1). */
export function setCookies(res: Response): SetCookie[] {
  const raw = res.headers['set-cookie'] as unknown;
  const list = Array.isArray(raw) ? (raw as string[]) : typeof raw === 'string' ? [raw] : [];
  return list.map((line) => {
    const [pair, ...flags] = line.split(';').map((s) => s.trim());
    const eq = pair.indexOf('=');
    return { name: pair.slice(0, eq), value: pair.slice(eq + 1), pair, flags };
  });
}

/** The session cookie a response set, if any. */
export const sessionCookie = (res: Response): SetCookie | undefined =>
  setCookies(res).find((c) => c.name === SESSION_COOKIE && c.value !== '');
