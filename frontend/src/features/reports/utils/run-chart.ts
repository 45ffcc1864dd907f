import type { CurveRun } from '@loamline/shared-types';
import { toDisplay, type UnitPrefs } from '@/lib/units';
import { forceIn } from './settings-units';

export interface ChartPoint {
  id: number;
  x: number;
  y: number;
}

export interface RunChartData {
  /** every measured point, in the order of the file, split by stroke */
  compression: ChartPoint[];
  rebound: ChartPoint[];
  /** the model at the run's travels, sorted by travel; empty without a comparison */
  model: { x: number[]; compression: number[]; rebound: number[] };
  /** axis ends, in the units shown */
  maxX: number;
  maxY: number;
}

/**
 * A run as the chart draws it, in the user's units: one marker per measured row (nothing dropped,
 * merged or interpolated) and the model's curve as lines. Pure; tested against the run's points.
 */
export function runChartData(run: CurveRun, prefs: UnitPrefs): RunChartData {
  const x = (mm: number) => toDisplay('length', mm, prefs);
  const y = (n: number) => forceIn(n, prefs);
  const compression: ChartPoint[] = [];
  const rebound: ChartPoint[] = [];
  run.points.forEach((p, i) => {
    (p.stroke === 'compression' ? compression : rebound).push({ id: i, x: x(p.travelMm), y: y(p.forceN) });
  });
  const m = [...(run.comparison?.model ?? [])].sort((a, b) => a.travelMm - b.travelMm);
  const model = {
    x: m.map((p) => x(p.travelMm)),
    compression: m.map((p) => y(p.compressionN)),
    rebound: m.map((p) => y(p.reboundN)),
  };
  const all = [...compression, ...rebound];
  const maxX = Math.max(0, ...all.map((p) => p.x), ...model.x);
  const maxY = Math.max(0, ...all.map((p) => p.y), ...model.compression, ...model.rebound);
  return { compression, rebound, model, maxX, maxY };
}
