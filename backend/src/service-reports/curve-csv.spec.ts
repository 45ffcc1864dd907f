import { CurveFileError, MM_PER_IN, N_PER_LBF, parseCurveCsv, TRAVEL_NOISE_MM } from './curve-csv';

const csv = (text: string) => parseCurveCsv(Buffer.from(text, 'utf8'));
const refusal = (text: string): string => {
  try {
    csv(text);
  } catch (e) {
    if (e instanceof CurveFileError) return e.message;
    throw e;
  }
  throw new Error('accepted');
};

describe('parseCurveCsv', () => {
  it('reads a full cycle: travel rising is compression, falling is rebound', () => {
    const r = csv('travel_mm,force_N\n0,100\n10,200\n20,320\n15,280\n5,150\n0,90\n');
    expect(r.units).toEqual({ travel: 'mm', force: 'N' });
    expect(r.points.map((p) => p.stroke)).toEqual([
      'compression',
      'compression',
      'compression',
      'rebound',
      'rebound',
      'rebound',
    ]);
    expect(r.points[2]).toEqual({ travelMm: 20, forceN: 320, stroke: 'compression' });
  });

  it('converts in and lbf with the exact factors of NIST SP 811 (B.8: 1 in = 25.4 mm, 1 lbf = 4.4482216152605 N)', () => {
    expect(MM_PER_IN).toBe(25.4);
    expect(N_PER_LBF).toBe(4.4482216152605);
    const r = csv('Travel (in),Force (lbf)\n0,10\n1,100\n0.5,60\n');
    expect(r.units).toEqual({ travel: 'in', force: 'lbf' });
    expect(r.points[1].travelMm).toBeCloseTo(25.4, 12);
    expect(r.points[1].forceN).toBeCloseTo(444.82216152605, 10);
  });

  it('accepts the documented header spellings, any case, and a direction column', () => {
    for (const h of [
      'travel_mm,force_n',
      'TRAVEL [MM], FORCE [N]',
      'travel mm,force N',
      'force (N),travel (mm)',
    ])
      expect(csv(`${h}\n0,0\n1,1\n`).points).toHaveLength(2);
    const r = csv('travel_mm,force_N,direction\n0,1,compression\n5,2,comp\n5,1.5,rebound\n0,0.5,r\n');
    expect(r.points.map((p) => p.stroke)).toEqual(['compression', 'compression', 'rebound', 'rebound']);
  });

  it('allows travel to step back by sensor noise within a stroke', () => {
    const r = csv(`travel_mm,force_N\n0,1\n10,2\n${10 - TRAVEL_NOISE_MM / 2},2.1\n20,3\n`);
    expect(r.points.every((p) => p.stroke === 'compression')).toBe(true);
  });

  it('refuses travel going backwards within a stroke, naming the line', () => {
    // compression to 20, rebound to 10, then up again to 25: the rebound went backwards on line 6
    expect(refusal('travel_mm,force_N\n0,1\n10,2\n20,3\n10,2\n25,3\n')).toMatch(
      /^line 6: travel goes backwards within the rebound stroke that began on line 5/,
    );
    expect(
      refusal('travel_mm,force_N,direction\n0,1,compression\n10,2,compression\n5,2,compression\n'),
    ).toMatch(/^line 4: travel goes backwards within the compression stroke/);
  });

  it('refuses text in a number column with its line', () => {
    expect(refusal('travel_mm,force_N\n0,1\n1,2\n2,abc\n')).toBe('line 4: force is not a number ("abc")');
    expect(refusal('travel_mm,force_N\n\n0,1\n1 mm,2\n')).toBe('line 4: travel is not a number ("1 mm")');
  });

  it('refuses an unknown header, a missing column and a short row', () => {
    expect(refusal('position,load\n0,1\n')).toMatch(/^line 1: unknown column "position"/);
    expect(refusal('travel_cm,force_N\n0,1\n')).toMatch(/^line 1: unknown column "travel_cm"/);
    expect(refusal('travel_mm\n0\n1\n')).toMatch(/^line 1: no force column/);
    expect(refusal('travel_mm,force_N\n0,1\n2\n')).toBe('line 3: 1 values, but the header names 2 columns');
    expect(refusal('')).toMatch(/^the file is empty/);
  });
});
