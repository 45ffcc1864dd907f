import type { CurveOverlay, CurvePoint, PartResult } from '@loamline/shared-types';
import Box from '@mui/material/Box';
import { ChartsReferenceLine } from '@mui/x-charts/ChartsReferenceLine';
import { LineChart } from '@mui/x-charts/LineChart';
import { useMemo } from 'react';
import { N_PER_LBF, formatNumber, psiToBar, toDisplay, unitOf, type UnitPrefs } from '@/lib/units';
import { ink, ochre, pine } from '@/theme/primitives';
import { usePrintMedia } from '../hooks/use-print-media';

/** Force in the rider's system: N with kg, lbf with lb. */
export const forceUnit = (units: UnitPrefs): 'N' | 'lbf' => (units.mass === 'lb' ? 'lbf' : 'N');
export const forceShown = (n: number, units: UnitPrefs): number => (units.mass === 'lb' ? n / N_PER_LBF : n);

/** The chart's force axis: kN once a curve passes 2500 N, so tick labels stay short. */
function forceAxis(maxN: number, units: UnitPrefs): { unit: string; scale: (n: number) => number } {
  if (units.mass === 'kg' && maxN > 2500) return { unit: 'kN', scale: (n) => n / 1000 };
  return { unit: forceUnit(units), scale: (n) => forceShown(n, units) };
}
export const formatForce = (n: number, units: UnitPrefs): string =>
  `${formatNumber(forceShown(n, units), 0)} ${forceUnit(units)}`;

const plain = new Intl.NumberFormat('en', { maximumFractionDigits: 1, useGrouping: false });

const SPACER_COLOURS = [ochre[300], ochre[500], ochre[700], '#6E4A17'];
const END_STROKE_COLOURS = ['#9CB4C9', '#5F7F9C', '#34506B', '#1F3347'];
const FAST_HIT_COLOUR = '#8A6F8F';

export function overlayColour(overlay: CurveOverlay, indexOfKind: number): string {
  if (overlay.kind === 'spacers') return SPACER_COLOURS[indexOfKind % SPACER_COLOURS.length];
  if (overlay.kind === 'end-stroke') return END_STROKE_COLOURS[indexOfKind % END_STROKE_COLOURS.length];
  return FAST_HIT_COLOUR;
}

/** Each overlay's colour, counted within its kind (spacers in ochre, end-stroke in slate). */
export function overlayColours(overlays: readonly CurveOverlay[]): string[] {
  const seen: Record<string, number> = {};
  return overlays.map((o) => {
    const i = seen[o.kind] ?? 0;
    seen[o.kind] = i + 1;
    return overlayColour(o, i);
  });
}

/** An overlay's name in the rider's units (the server names end-stroke pressures in psi). */
export function overlayLabel(o: CurveOverlay, units: UnitPrefs): string {
  if (o.kind === 'end-stroke' && typeof o.endStrokePsi === 'number') {
    return `end-stroke ${
      units.pressure === 'bar'
        ? `${formatNumber(psiToBar(o.endStrokePsi), 1)} bar`
        : `${formatNumber(o.endStrokePsi, 0)} psi`
    }`;
  }
  return o.label;
}

/** Linear interpolation of a curve at x; null outside it (display only, not the spring model). */
function at(curve: readonly CurvePoint[], x: number): number | null {
  if (!curve.length || x < curve[0].travelMm - 1e-9 || x > curve[curve.length - 1].travelMm + 1e-9)
    return null;
  let lo = 0;
  let hi = curve.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (curve[mid].travelMm <= x) lo = mid;
    else hi = mid;
  }
  const a = curve[lo];
  const b = curve[hi];
  if (b.travelMm === a.travelMm) return a.forceN;
  const t = Math.min(1, Math.max(0, (x - a.travelMm) / (b.travelMm - a.travelMm)));
  return a.forceN + t * (b.forceN - a.forceN);
}

/** All curves on one travel grid (the union of their points), as the chart wants them. */
export function commonGrid(curves: readonly (readonly CurvePoint[])[]): {
  xs: number[];
  ys: (number | null)[][];
} {
  const set = new Set<number>();
  for (const c of curves) for (const p of c) set.add(Math.round(p.travelMm * 1000) / 1000);
  const xs = [...set].sort((a, b) => a - b);
  return { xs, ys: curves.map((c) => xs.map((x) => at(c, x))) };
}

/**
 * The spring's force against travel at the baseline pressure (n = 1), with the result's overlays
 * (more spacers, end-stroke pressures, a fast hit), the sag point and the hard-landing load.
 */
export function SpringCurveChart({
  result,
  units,
  title,
  height = 300,
}: {
  result: PartResult;
  units: UnitPrefs;
  title: string;
  height?: number;
}) {
  const lengthUnit = unitOf('length', units);
  const printing = usePrintMedia();
  const data = useMemo(() => {
    const curves = [result.curve, ...result.overlays.map((o) => o.curve)];
    const { xs, ys } = commonGrid(curves);
    const colours = overlayColours(result.overlays);
    const maxN = Math.max(0, ...curves.flatMap((c) => c.map((p) => p.forceN)));
    const axis = forceAxis(maxN, units);
    return {
      axis,
      xs: xs.map((x) => toDisplay('length', x, units)),
      series: [
        {
          id: 'baseline',
          label: 'This baseline',
          data: ys[0].map((y) => (y === null ? null : axis.scale(y))),
          color: pine[500],
          showMark: false,
        },
        ...result.overlays.map((o, i) => ({
          id: `overlay-${i}`,
          label: overlayLabel(o, units),
          data: ys[i + 1].map((y) => (y === null ? null : axis.scale(y))),
          color: colours[i],
          showMark: false,
        })),
      ],
      fastHitIds: result.overlays
        .map((o, i) => (o.kind === 'fast-hit' ? `overlay-${i}` : null))
        .filter(Boolean),
    };
  }, [result, units]);

  const dashed = Object.fromEntries(
    data.fastHitIds.map((id) => [`& [data-series="${id}"]`, { strokeDasharray: '6 4' }]),
  );
  const sagX = toDisplay('length', result.targetSagMm, units);
  const landingY = data.axis.scale(result.hardLandingLoadN);

  return (
    <Box
      role="figure"
      aria-label={title}
      className="spring-chart"
      sx={{ width: '100%', '& svg': { overflow: 'visible' } }}
    >
      <LineChart
        height={printing ? 150 : height}
        skipAnimation
        series={data.series}
        xAxis={[
          {
            data: data.xs,
            scaleType: 'linear',
            min: 0,
            max: toDisplay('length', result.travelMm, units),
            label: `Travel (${lengthUnit})`,
            valueFormatter: (v: number) => formatNumber(v, lengthUnit === 'in' ? 1 : 0),
          },
        ]}
        yAxis={[
          {
            min: 0,
            label: `Force (${data.axis.unit})`,
            valueFormatter: (v: number) => plain.format(v),
            width: 58,
          },
        ]}
        grid={{ horizontal: true }}
        margin={{ top: 16, right: 12, bottom: 8, left: 4 }}
        slotProps={{
          legend: { direction: 'horizontal', position: { vertical: 'bottom', horizontal: 'center' } },
        }}
        sx={{
          '& [data-series="baseline"]': { strokeWidth: 3.5 },
          ...dashed,
        }}
      >
        <ChartsReferenceLine
          x={sagX}
          label="sag"
          labelAlign="start"
          lineStyle={{ stroke: ink, strokeDasharray: '3 3' }}
          labelStyle={{ fontSize: 12, fill: ink }}
        />
        <ChartsReferenceLine
          y={landingY}
          label="hard landing"
          labelAlign="start"
          lineStyle={{ stroke: ochre[700], strokeDasharray: '2 4' }}
          labelStyle={{ fontSize: 12, fill: ochre[700] }}
        />
      </LineChart>
    </Box>
  );
}
