import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiRequestError } from '@/lib/api-client';

export const TOO_MANY_TRIES = 'Too many tries — wait a minute, then try again.';
export const WRONG_CREDENTIALS = 'E-mail or password is wrong.';

/**
 * Puts what the server said where the user looks: a 400's `fields` under their inputs, everything
 * else as one message for the form (returned). `messages` overrides the text per status.
 */
export function showServerError<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fieldNames: readonly Path<T>[],
  messages: Partial<Record<number, string>> = {},
): string | null {
  if (!(error instanceof ApiRequestError)) {
    return 'Loamline could not reach the server. Check your connection and try again.';
  }
  if (messages[error.status]) return messages[error.status]!;
  if (error.status === 429) return TOO_MANY_TRIES;
  if (error.status === 400 && error.body.fields) {
    let unplaced = false;
    for (const [name, message] of Object.entries(error.body.fields)) {
      if ((fieldNames as readonly string[]).includes(name))
        setError(name as Path<T>, { message: sentence(message) });
      else unplaced = true;
    }
    // The server's message names every field; show it when one has no input here.
    return unplaced ? error.body.message : null;
  }
  return error.body.message;
}

/** The server's field messages are fragments ("must be an e-mail address"): "Must be an e-mail address." */
export function sentence(fragment: string): string {
  const t = fragment.trim();
  if (!t) return t;
  return t[0].toUpperCase() + t.slice(1) + (/[.!?]$/.test(t) ? '' : '.');
}

/** Only in-app paths may follow a sign-in (no `//elsewhere`, no `https://…`). */
export function safeNext(next: string | null | undefined, fallback = '/'): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return fallback;
  return next;
}
