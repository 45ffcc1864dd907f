/**
 * The wire format of the hosted API's requests: `application/x-www-form-urlencoded` with bracket
 * nesting, as the stripe SDK writes it (`metadata[appointmentId]=42`, `expand[0]=latest_charge`,
 * `payment_method_data[card][number]=…`); browsers also send `expand[]=…`. The SDK has no `qs` of
 * its own any more, so the fake reads it here. Every leaf stays a string, as on the real service.
 */
export type FormValue = string | FormValue[] | { [key: string]: FormValue };
export type FormParams = { [key: string]: FormValue };

const MAX_DEPTH = 6;
const FORBIDDEN = new Set(['__proto__', 'constructor', 'prototype']);

/** Splits `a[b][c]` into `['a', 'b', 'c']` and `a[]` into `['a', '']`; null when malformed. */
function keyPath(key: string): string[] | null {
  const open = key.indexOf('[');
  if (open === -1) return key === '' || FORBIDDEN.has(key) ? null : [key];
  const path = [key.slice(0, open)];
  if (path[0] === '') return null;
  const rest = key.slice(open);
  const re = /\[([^[\]]*)\]/g;
  let consumed = 0;
  for (let m = re.exec(rest); m; m = re.exec(rest)) {
    if (m.index !== consumed) return null;
    path.push(m[1]);
    consumed = m.index + m[0].length;
  }
  if (consumed !== rest.length || path.length > MAX_DEPTH) return null;
  return path.some((seg) => FORBIDDEN.has(seg)) ? null : path;
}

type Node = { [key: string]: Node | string };

/** Objects whose keys are all indexes (or appended with `[]`) become arrays, in index order. */
function finish(node: Node | string): FormValue {
  if (typeof node === 'string') return node;
  const keys = Object.keys(node);
  const values = (k: string): FormValue => finish(node[k]);
  if (keys.length > 0 && keys.every((k) => /^\d+$/.test(k) || k.startsWith('\u0000'))) {
    return keys
      .map((k) => ({ k, i: k.startsWith('\u0000') ? Number(k.slice(1)) + 1e9 : Number(k) }))
      .sort((a, b) => a.i - b.i)
      .map(({ k }) => values(k));
  }
  const out: { [key: string]: FormValue } = {};
  for (const k of keys) out[k] = values(k);
  return out;
}

export class FormError extends Error {}

export function parseForm(body: string): FormParams {
  const root: Node = {};
  let appended = 0;
  for (const pair of body.split('&')) {
    if (pair === '') continue;
    const eq = pair.indexOf('=');
    const rawKey = eq === -1 ? pair : pair.slice(0, eq);
    const rawValue = eq === -1 ? '' : pair.slice(eq + 1);
    const decode = (s: string): string => {
      try {
        return decodeURIComponent(s.replace(/\+/g, ' '));
      } catch {
        throw new FormError(`Invalid URL encoding in ${s.slice(0, 40)}`);
      }
    };
    const key = decode(rawKey);
    const value = decode(rawValue);
    const path = keyPath(key);
    if (!path) throw new FormError(`Invalid parameter name: ${key}`);
    let node = root;
    for (let i = 0; i < path.length; i++) {
      let seg = path[i];
      if (seg === '' && i > 0) seg = `\u0000${appended++}`;
      if (i === path.length - 1) {
        if (typeof node[seg] === 'object') throw new FormError(`Invalid parameter: ${key} is a hash`);
        node[seg] = value;
      } else {
        const next = node[seg];
        if (typeof next === 'string') throw new FormError(`Invalid parameter: ${path[0]} is not a hash`);
        node = node[seg] = next ?? {};
      }
    }
  }
  return finish(root) as FormParams;
}

/** The same parameters, keys sorted: what the idempotency check compares. */
export function fingerprint(params: FormValue): string {
  const norm = (v: FormValue): unknown => {
    if (typeof v === 'string') return v;
    if (Array.isArray(v)) return v.map(norm);
    return Object.fromEntries(
      Object.keys(v)
        .sort()
        .map((k) => [k, norm(v[k])]),
    );
  };
  return JSON.stringify(norm(params));
}
