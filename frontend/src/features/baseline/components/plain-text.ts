import { cToF, formatNumber, mmToIn, mToFt, psiToBar, type UnitPrefs } from '@/lib/units';

/**
 * Text from the server as a rider reads it: no internal references. The server writes none today,
 * but baseline sheets saved before kept its old texts ("see docs/spring-model.md"): a file name is
 * dropped, and a bare symbol ("n = 1.4") is put in words. The technical detail itself is under "How this was worked out".
 *
 * With `units`, the server's psi, mm, metres and °C are put in the rider's units (it writes its
 * messages in the API's units), so a warning never reads "350 psi" beside a "24.1 bar" title.
 */
export function riderText(text: string, units?: UnitPrefs): string {
  const plain = text
    .replace(/\(\s*see\s+[\w./-]+\.md\s*\)/gi, '')
    .replace(/[,;]?\s*see\s+[\w./-]+\.md/gi, '')
    .replace(/\(\s*[\w./-]+\.md\s*\)/g, '')
    .replace(/[\w./-]+\.md\b/g, '')
    .replace(/\(\s*n\s*=\s*(\d+(?:\.\d+)?)\s*\)/g, '(air index $1)')
    .replace(/\bn\s*=\s*(\d+(?:\.\d+)?)/g, 'air index $1')
    .replace(/\(\s*\)/g, '')
    .replace(/\s{2,}/g, ' ')
    .replace(/\s+([,.;:)])/g, '$1')
    .trim();
  return units ? inRiderUnits(plain, units) : plain;
}

const num = (s: string): number => Number(s.replace(/,/g, ''));
const NUMBER = String.raw`(-?\d[\d,]*(?:\.\d+)?)`;

/**
 * The server's "350 psi", "160 mm", "(91 m)" and "4.4 °C" in the rider's units. Stanchion sizes
 * stay in mm (they are sold and chosen in mm). Altitudes the server rounded to the metre are
 * shown to 10 ft, so "300 ft" typed in does not come back as "299 ft".
 */
export function inRiderUnits(text: string, units: UnitPrefs): string {
  let t = text;
  if (units.pressure === 'bar')
    t = t.replace(
      new RegExp(`${NUMBER} psi\\b`, 'g'),
      (_m, n: string) => `${formatNumber(psiToBar(num(n)), 1)} bar`,
    );
  if (units.length === 'in') {
    const inch = (n: string) => formatNumber(mmToIn(num(n)), 2);
    // "141 of 160 mm": both are lengths
    t = t
      .replace(
        new RegExp(`${NUMBER} of ${NUMBER} mm\\b(?! stanchion)`, 'g'),
        (_m, a: string, b: string) => `${inch(a)} of ${inch(b)} in`,
      )
      .replace(new RegExp(`${NUMBER} mm\\b(?! stanchion)`, 'g'), (_m, n: string) => `${inch(n)} in`);
  }
  if (units.altitude === 'ft')
    t = t.replace(
      new RegExp(`\\(${NUMBER} m\\)`, 'g'),
      (_m, n: string) => `(${formatNumber(Math.round(mToFt(num(n)) / 10) * 10, 0)} ft)`,
    );
  if (units.temperature === '°F')
    t = t.replace(
      new RegExp(`${NUMBER} °C\\b`, 'g'),
      (_m, n: string) => `${formatNumber(cToF(num(n)), 0)} °F`,
    );
  return t;
}
