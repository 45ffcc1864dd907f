import { parse } from 'csv-parse/sync';
import type { MeasuredPoint } from '@loamline/shared-types';

/** Millimetres in an inch, exact by definition (NIST SP 811, B.8: 1 in = 2.54 cm). */
export const MM_PER_IN = 25.4;
/**
 * Newtons in a pound-force, exact (NIST SP 811, B.8: 1 lbf = 4.448 221 615 260 5 N; the
 * international avoirdupois pound, 0.453 592 37 kg, times standard gravity, 9.806 65 m/s²).
 */
export const N_PER_LBF = 4.4482216152605;
/**
 * How far travel may step back within a stroke before the file is refused: the jitter of a bench
 * dyno's travel sensor at a stroke's slow ends (common practice, no source). Anything more is a
 * stroke going the wrong way, not noise.
 */
export const TRAVEL_NOISE_MM = 0.5;
/** The longest travel a fork or shock bench run can have (the sag limit of the report). */
export const MAX_TRAVEL_MM = 400;

export type TravelUnit = 'mm' | 'in';
export type ForceUnit = 'N' | 'lbf';

export interface ParsedCurve {
  units: { travel: TravelUnit; force: ForceUnit };
  points: MeasuredPoint[];
}

/** A file that is not a bench curve Loamline reads; the message names the line where it can. */
export class CurveFileError extends Error {
  override readonly name = 'CurveFileError';
}

// A header cell: the quantity, then its unit after `_`, a space, or in ( ) or [ ].
const UNIT_CELL = /^(travel|force)\s*(?:_|\s|\(|\[)\s*(mm|in|n|lbf)\s*[)\]]?$/;
const DIRECTION_CELL = /^(direction|stroke)$/;
const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:e[+-]?\d+)?$/i;
const DIRECTIONS: Record<string, MeasuredPoint['stroke']> = {
  compression: 'compression',
  comp: 'compression',
  c: 'compression',
  rebound: 'rebound',
  reb: 'rebound',
  r: 'rebound',
};
const HEADER_HELP =
  'the first line must name the columns with their units: travel in mm or in, force in N or lbf ' +
  '(e.g. "travel_mm,force_N" or "travel (in),force (lbf)"), and optionally "direction"';

interface Row {
  line: number;
  travelMm: number;
  forceN: number;
  stroke: MeasuredPoint['stroke'] | null;
}

/**
 * Reads a bench dyno's force–travel export (docs/service-reports.md): a header naming travel and
 * force with their units, an optional direction column, then one point per line. Without a
 * direction the file is one cycle: travel rises (compression) then falls (rebound). Points come
 * back in mm and N, in file order.
 */
export function parseCurveCsv(bytes: Buffer): ParsedCurve {
  const text = bytes.toString('utf8');
  if (text.includes('\uFFFD') || text.includes('\u0000'))
    throw new CurveFileError('the file is not UTF-8 text; export the curve as CSV');
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, {
      bom: true,
      trim: true,
      skip_empty_lines: true,
      comment: '#',
      relax_column_count: true,
      info: true,
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (e) {
    const err = e as { lines?: number; message?: string };
    throw new CurveFileError(
      `${err.lines ? `line ${err.lines}: ` : ''}not readable as CSV (${String(err.message ?? e).replace(/^.*?: /, '')})`,
    );
  }
  if (!records.length) throw new CurveFileError(`the file is empty; ${HEADER_HELP}`);

  const [head, ...body] = records;
  const cols = readHeader(head.record, head.info.lines);
  const rows: Row[] = [];
  for (const { record, info } of body) {
    const line = info.lines;
    if (record.length !== head.record.length)
      throw new CurveFileError(
        `line ${line}: ${record.length} values, but the header names ${head.record.length} columns`,
      );
    const num = (i: number, what: string): number => {
      const v = record[i];
      if (!NUMBER.test(v)) throw new CurveFileError(`line ${line}: ${what} is not a number (${quote(v)})`);
      return Number(v);
    };
    const travel = num(cols.travel, 'travel') * (cols.units.travel === 'in' ? MM_PER_IN : 1);
    const force = num(cols.force, 'force') * (cols.units.force === 'lbf' ? N_PER_LBF : 1);
    if (travel < -TRAVEL_NOISE_MM) throw new CurveFileError(`line ${line}: travel is negative`);
    if (travel > MAX_TRAVEL_MM)
      throw new CurveFileError(`line ${line}: travel is more than ${MAX_TRAVEL_MM} mm`);
    let stroke: Row['stroke'] = null;
    if (cols.direction !== null) {
      stroke = DIRECTIONS[record[cols.direction].toLowerCase()] ?? null;
      if (!stroke)
        throw new CurveFileError(
          `line ${line}: direction must be compression or rebound (${quote(record[cols.direction])})`,
        );
    }
    rows.push({ line, travelMm: travel, forceN: force, stroke });
  }
  return { units: cols.units, points: strokes(rows) };
}

function readHeader(cells: string[], line: number) {
  let travel = -1;
  let force = -1;
  let direction: number | null = null;
  const units = { travel: 'mm' as TravelUnit, force: 'N' as ForceUnit };
  cells.forEach((raw, i) => {
    const cell = raw.toLowerCase().replace(/\s+/g, ' ');
    const m = UNIT_CELL.exec(cell);
    if (m && m[1] === 'travel' && (m[2] === 'mm' || m[2] === 'in') && travel < 0) {
      travel = i;
      units.travel = m[2];
    } else if (m && m[1] === 'force' && (m[2] === 'n' || m[2] === 'lbf') && force < 0) {
      force = i;
      units.force = m[2] === 'n' ? 'N' : 'lbf';
    } else if (DIRECTION_CELL.test(cell) && direction === null) {
      direction = i;
    } else {
      throw new CurveFileError(`line ${line}: unknown column ${quote(raw)}; ${HEADER_HELP}`);
    }
  });
  if (travel < 0 || force < 0)
    throw new CurveFileError(`line ${line}: no ${travel < 0 ? 'travel' : 'force'} column; ${HEADER_HELP}`);
  return { travel, force, direction, units };
}

/**
 * Gives each row its stroke and refuses travel that goes backwards within one (more than
 * TRAVEL_NOISE_MM): compression rises, rebound falls. Without a direction column the first fall
 * beyond the noise begins the rebound, and any later rise beyond it is refused.
 */
function strokes(rows: Row[]): MeasuredPoint[] {
  if (rows.length < 2) throw new CurveFileError('the file has fewer than 2 points');
  let current: MeasuredPoint['stroke'] = rows[0].stroke ?? 'compression';
  let extreme = rows[0].travelMm; // the furthest travel of the stroke so far
  let strokeStart = rows[0].line;
  const out: MeasuredPoint[] = [];
  for (const r of rows) {
    if (r.stroke !== null && r.stroke !== current) {
      current = r.stroke;
      extreme = r.travelMm;
      strokeStart = r.line;
    } else if (r.stroke === null && current === 'compression' && r.travelMm < extreme - TRAVEL_NOISE_MM) {
      current = 'rebound'; // the turn at the end of the compression stroke
      extreme = r.travelMm;
      strokeStart = r.line;
    } else {
      const back = current === 'compression' ? extreme - r.travelMm : r.travelMm - extreme;
      if (back > TRAVEL_NOISE_MM)
        throw new CurveFileError(
          `line ${r.line}: travel goes backwards within the ${current} stroke that began on line ${strokeStart} ` +
            `(${fmt(r.travelMm)} mm after ${fmt(extreme)} mm; more than the ${TRAVEL_NOISE_MM} mm allowed for sensor noise). ` +
            'A file holds one cycle: compression (travel rising), then rebound (travel falling).',
        );
      extreme = current === 'compression' ? Math.max(extreme, r.travelMm) : Math.min(extreme, r.travelMm);
    }
    out.push({ travelMm: r.travelMm, forceN: r.forceN, stroke: current });
  }
  if (out.filter((p) => p.stroke === 'compression').length < 2)
    throw new CurveFileError('the file has no compression stroke (at least 2 points with travel rising)');
  return out;
}

const fmt = (n: number) => String(Math.round(n * 100) / 100);
const quote = (v: string) => (v === '' ? 'empty' : `"${v.length > 40 ? `${v.slice(0, 40)}…` : v}"`);
