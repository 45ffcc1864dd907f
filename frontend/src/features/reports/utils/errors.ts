import { ApiRequestError } from '@/lib/api-client';

/** The server's words, as they are ("line 14: force is not a number"), with any per-field messages. */
export function serverMessage(e: unknown, fallback = 'Loamline could not reach the server.'): string {
  if (!(e instanceof ApiRequestError)) return fallback;
  const fields = e.body.fields ? Object.values(e.body.fields).filter((m) => m && m !== e.body.message) : [];
  return [e.body.message, ...fields].join(' ');
}
