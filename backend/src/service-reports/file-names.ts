import { REPORT_LIMITS } from '@loamline/shared-types';

/**
 * An uploaded file's name as it may be shown: the last part of any path (`../../x.jpg` and
 * `C:\x\y.jpg` keep `x.jpg` and `y.jpg`), without control or text-direction characters, trimmed,
 * at most 200 characters (the extension kept). Never used to store anything.
 */
export function cleanFileName(raw: string | undefined, fallback: string): string {
  const base = (raw ?? '').split(/[/\\]/).pop() ?? '';
  const clean = base
    .normalize('NFC')
    // control characters, text-direction marks and overrides, lone surrogates, non-characters
    .replace(/[\p{Cc}\u202A-\u202E\u2066-\u2069\u200E\u200F\u061C\uFFFE\uFFFF]|\p{Cs}/gu, '')
    .trim()
    .replace(/^\.+/, '');
  if (!clean) return fallback;
  const max = REPORT_LIMITS.fileNameChars;
  const chars = [...clean];
  if (chars.length <= max) return clean;
  const dot = clean.lastIndexOf('.');
  const ext = dot > 0 && clean.length - dot <= 10 ? clean.slice(dot) : '';
  return [...clean.slice(0, clean.length - ext.length)].slice(0, max - [...ext].length).join('') + ext;
}

/** `Content-Disposition: inline` with the name: ASCII in `filename`, the exact name in `filename*` (RFC 6266). */
export function inlineDisposition(name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  const exact = encodeURIComponent(name).replace(
    /['()*]/g,
    (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`,
  );
  return ascii === name
    ? `inline; filename="${ascii}"`
    : `inline; filename="${ascii}"; filename*=UTF-8''${exact}`;
}
