import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { inboxPage, messagePage, notFoundPage } from './pages';
import type { MailStore } from './store';

export interface WebOptions {
  /** Shown on the empty inbox page: where to send mail (`127.0.0.1:1025`). */
  smtpAddress: string;
}

/**
 * The pages inherit this policy, and so does the mail's HTML in its `srcdoc` frame: no script
 * anywhere, images and styles of the mail may load, forms only to this server.
 */
const PAGE_CSP = [
  "default-src 'none'",
  "style-src 'unsafe-inline' http: https:",
  'img-src http: https: data: blob:',
  'font-src http: https: data:',
  "form-action 'self'",
].join('; ');

const COMMON_HEADERS = { 'cache-control': 'no-store', 'x-content-type-options': 'nosniff' };

function sendJson(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { ...COMMON_HEADERS, 'content-type': 'application/json; charset=utf-8' });
  res.end(JSON.stringify(body));
}

/** The same error shape as the app's API (`ApiError`: statusCode, error, message). */
function sendJsonError(res: ServerResponse, status: 404 | 405, message: string): void {
  sendJson(res, status, {
    statusCode: status,
    error: status === 404 ? 'Not Found' : 'Method Not Allowed',
    message,
  });
}

function sendHtml(res: ServerResponse, status: number, html: string): void {
  res.writeHead(status, {
    ...COMMON_HEADERS,
    'content-type': 'text/html; charset=utf-8',
    'content-security-policy': PAGE_CSP,
    'referrer-policy': 'no-referrer',
  });
  res.end(html);
}

type Route =
  | { name: 'health' }
  | { name: 'list' }
  | { name: 'one'; id: string }
  | { name: 'raw'; id: string }
  | { name: 'inbox' }
  | { name: 'page'; id: string };

/** Which methods each route answers (HEAD goes with GET; node:http leaves its body out). */
const METHODS: Record<Route['name'], string[]> = {
  health: ['GET', 'HEAD'],
  list: ['GET', 'HEAD', 'DELETE'],
  one: ['GET', 'HEAD'],
  raw: ['GET', 'HEAD'],
  inbox: ['GET', 'HEAD'],
  page: ['GET', 'HEAD'],
};

function decode(segment: string): string | null {
  try {
    return decodeURIComponent(segment);
  } catch {
    return null;
  }
}

function route(pathname: string): Route | null {
  const path = pathname.length > 1 ? pathname.replace(/\/+$/, '') : pathname;
  if (path === '/health') return { name: 'health' };
  if (path === '/api/messages') return { name: 'list' };
  if (path === '/') return { name: 'inbox' };
  let m = /^\/api\/messages\/([^/]+)\/raw$/.exec(path);
  if (m) {
    const id = decode(m[1]);
    return id === null ? null : { name: 'raw', id };
  }
  m = /^\/api\/messages\/([^/]+)$/.exec(path);
  if (m) {
    const id = decode(m[1]);
    return id === null ? null : { name: 'one', id };
  }
  m = /^\/messages\/([^/]+)$/.exec(path);
  if (m) {
    const id = decode(m[1]);
    return id === null ? null : { name: 'page', id };
  }
  return null;
}

/** The web side: health, the JSON inbox for tests and the inbox pages for people. */
export function createWebServer(store: MailStore, options: WebOptions): Server {
  const handle = (req: IncomingMessage, res: ServerResponse): void => {
    const url = new URL(req.url ?? '/', 'http://127.0.0.1');
    const method = req.method ?? 'GET';
    const r = route(url.pathname);
    const isApi = url.pathname.startsWith('/api/') || url.pathname === '/health';
    if (!r) {
      if (isApi) sendJsonError(res, 404, `No route ${method} ${url.pathname}`);
      else sendHtml(res, 404, notFoundPage(`There is no page at ${url.pathname}.`));
      return;
    }
    if (!METHODS[r.name].includes(method)) {
      res.setHeader('allow', METHODS[r.name].join(', '));
      sendJsonError(res, 405, `${method} is not allowed on ${url.pathname}`);
      return;
    }
    const to = url.searchParams.get('to')?.trim() ?? '';
    switch (r.name) {
      case 'health':
        sendJson(res, 200, { status: 'ok', service: 'mail-fake' });
        return;
      case 'list':
        if (method === 'DELETE') {
          store.clear();
          res.writeHead(204, COMMON_HEADERS);
          res.end();
        } else sendJson(res, 200, store.list(to || undefined));
        return;
      case 'one': {
        const message = store.get(r.id);
        if (message) sendJson(res, 200, message);
        else sendJsonError(res, 404, `No message with id ${r.id}`);
        return;
      }
      case 'raw': {
        const raw = store.raw(r.id);
        if (!raw) {
          sendJsonError(res, 404, `No message with id ${r.id}`);
          return;
        }
        // Shown as text in a browser; `?download` gives the .eml file (RFC 5322 source, message/rfc822).
        const download = url.searchParams.has('download');
        res.writeHead(200, {
          ...COMMON_HEADERS,
          'content-type': download ? 'message/rfc822' : 'text/plain; charset=utf-8',
          'content-length': raw.length,
          ...(download ? { 'content-disposition': `attachment; filename="${r.id}.eml"` } : {}),
        });
        res.end(raw);
        return;
      }
      case 'inbox':
        sendHtml(res, 200, inboxPage(store.list(to || undefined), to, options.smtpAddress));
        return;
      case 'page': {
        const message = store.get(r.id);
        if (message) sendHtml(res, 200, messagePage(message));
        else sendHtml(res, 404, notFoundPage('No message with this id (the inbox may have been emptied).'));
        return;
      }
    }
  };
  return createServer(handle);
}
