/**
 * WCAG 2.x contrast ratio (WCAG 2.2, "relative luminance" and "contrast ratio" definitions; the
 * sRGB threshold 0.04045 of IEC 61966-2-1, which WCAG 2.2 uses): (L1 + 0.05) / (L2 + 0.05), L1 the
 * lighter colour's relative luminance. Reads `#RRGGBB`, `#RGB` and `rgb(r, g, b)`.
 */
function channels(colour: string): [number, number, number] {
  const c = colour.trim();
  const rgb = /^rgba?\(\s*(\d+(?:\.\d+)?)\s*,\s*(\d+(?:\.\d+)?)\s*,\s*(\d+(?:\.\d+)?)/i.exec(c);
  if (rgb) return [Number(rgb[1]), Number(rgb[2]), Number(rgb[3])];
  let hex = c.replace(/^#/, '');
  if (hex.length === 3) hex = [...hex].map((x) => x + x).join('');
  if (!/^[0-9a-f]{6}$/i.test(hex)) throw new Error(`not a colour: ${colour}`);
  return [0, 2, 4].map((i) => parseInt(hex.slice(i, i + 2), 16)) as [number, number, number];
}

export function relativeLuminance(colour: string): number {
  const [r, g, b] = channels(colour).map((v) => {
    const s = v / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

export function contrastRatio(a: string, b: string): number {
  const la = relativeLuminance(a);
  const lb = relativeLuminance(b);
  return (Math.max(la, lb) + 0.05) / (Math.min(la, lb) + 0.05);
}
