/** One section in the app bar's navigation. */
export interface NavItem {
  label: string;
  to: string;
}

/** Up to two initials for an avatar (`Olu Owner` → `OO`). */
export const initials = (name: string): string =>
  name
    .split(/\s+/)
    .filter(Boolean)
    .slice(0, 2)
    .map((w) => w[0].toUpperCase())
    .join('') || '?';
