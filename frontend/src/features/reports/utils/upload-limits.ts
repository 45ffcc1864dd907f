/** What the server takes (issue 11); checked here first only to save a wasted upload. */
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024;
export const PHOTO_MAX_COUNT = 6;
export const CURVE_MAX_BYTES = 1024 * 1024;

export function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${(n / (1024 * 1024)).toFixed(1)} MB`;
  if (n >= 1024) return `${Math.round(n / 1024)} kB`;
  return `${n} bytes`;
}

/** Why a photo would be refused, before sending it; the server checks the content again. */
export function photoProblem(file: File, already: number): string | null {
  if (already >= PHOTO_MAX_COUNT) return `At most ${PHOTO_MAX_COUNT} photos per appointment.`;
  if (!(PHOTO_TYPES as readonly string[]).includes(file.type))
    return `${file.name}: only JPEG, PNG or WebP photos.`;
  if (file.size > PHOTO_MAX_BYTES)
    return `${file.name} is ${formatBytes(file.size)}: at most 8 MB per photo.`;
  return null;
}

export function curveProblem(file: File): string | null {
  if (file.size > CURVE_MAX_BYTES)
    return `${file.name} is ${formatBytes(file.size)}: at most 1 MB per curve.`;
  return null;
}
