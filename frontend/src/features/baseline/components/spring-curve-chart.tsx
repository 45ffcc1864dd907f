import type { CurveOverlay, CurvePoint, PartResult } from '@loamline/shared-types';
import Box from '@mui/material/Box';
import ButtonBase from '@mui/material/ButtonBase';
import Typography from '@mui/material/Typography';
import Skeleton from '@mui/material/Skeleton';
import { lazy, Suspense, useMemo, useState } from 'react';
import { N_PER_LBF, formatNumber, psiToBar, toDisplay, unitOf, type UnitPrefs } from '@/lib/units';
import { ochre, pine } from '@/theme/primitives';
import { usePrintMedia } from '../hooks/use-print-media';

// MUI X Charts only once a result is drawn (docs/performance.md, "First screen")
const SpringCurvePlot = lazy(() => import('./spring-curve-plot'));

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

/*
 * Every curve differs from the others in colour AND dash pattern, so none depends on colour alone:
 * the baseline solid and thick; its hard landing long dashes; spacer counts in ochre to brown,
 * end-stroke pressures in slate blues, each with its own pattern.
 */
const SPACER_COLOURS = [ochre[700], '#B06F12', '#6E4A17', '#8C5A1E', '#4F3410', '#A0661A'];
const SPACER_DASHES = ['2 3', '8 3', '8 3 2 3', '14 3', '2 6', '4 2 4 6'];
const END_STROKE_COLOURS = ['#4F7394', '#2F5A80', '#34506B', '#1F3347', '#3F6A92', '#2A4560'];
const END_STROKE_DASHES = ['1 3', '6 3', '10 3 2 3 2 3', '3 2', '12 6', '2 3 8 3'];
const HARD_LANDING_COLOUR = pine[700];
const HARD_LANDING_DASH = '12 4';
const BASELINE_COLOUR = pine[500];

/** How one curve is drawn and named, the same in the chart, its legend and the table. */
export interface CurveStyle {
  id: string;
  label: string;
  colour: string;
  /** SVG stroke-dasharray; '' is solid */
  dash: string;
  width: number;
  /** index into `result.overlays`; -1 for the baseline (slow) curve */
  overlay: number;
}

/** An overlay's name in the rider's words and units (the server names end-stroke pressures in psi). */
export function overlayLabel(o: CurveOverlay, units: UnitPrefs, fittedSpacers?: number): string {
  if (o.kind === 'fast-hit') return 'Hard landing, as set';
  if (o.kind === 'end-stroke' && typeof o.endStrokePsi === 'number') {
    return `End-stroke ${
      units.pressure === 'bar'
        ? `${formatNumber(psiToBar(o.endStrokePsi), 1)} bar`
        : `${formatNumber(o.endStrokePsi, 0)} psi`
    }`;
  }
  if (o.kind === 'spacers' && typeof o.spacers === 'number') {
    const n = o.spacers;
    const diff =
      fittedSpacers === undefined || fittedSpacers === n
        ? ''
        : ` (${Math.abs(n - fittedSpacers)} ${n < fittedSpacers ? 'fewer' : 'more'})`;
    return `${n} spacer${n === 1 ? '' : 's'}${diff}`;
  }
  return o.label;
}

/** The baseline and each overlay with its colour, dash pattern and name. */
export function curveStyles(result: PartResult, units: UnitPrefs, fittedSpacers?: number): CurveStyle[] {
  const seen: Record<string, number> = {};
  return [
    {
      id: 'baseline',
      label: 'Slow push (sag), as set',
      colour: BASELINE_COLOUR,
      dash: '',
      width: 3.5,
      overlay: -1,
    },
    ...result.overlays.map((o, i): CurveStyle => {
      const k = seen[o.kind] ?? 0;
      seen[o.kind] = k + 1;
      const base = { id: `overlay-${i}`, label: overlayLabel(o, units, fittedSpacers), overlay: i };
      if (o.kind === 'spacers')
        return {
          ...base,
          colour: SPACER_COLOURS[k % SPACER_COLOURS.length],
          dash: SPACER_DASHES[k % SPACER_DASHES.length],
          width: 2,
        };
      if (o.kind === 'end-stroke')
        return {
          ...base,
          colour: END_STROKE_COLOURS[k % END_STROKE_COLOURS.length],
          dash: END_STROKE_DASHES[k % END_STROKE_DASHES.length],
          width: 2,
        };
      return { ...base, colour: HARD_LANDING_COLOUR, dash: HARD_LANDING_DASH, width: 3 };
    }),
  ];
}

/** A short line in a curve's colour and dash pattern: the key beside a legend entry or a table row. */
export function CurveSwatch({ style }: { style: Pick<CurveStyle, 'colour' | 'dash' | 'width'> }) {
  return (
    <Box component="svg" aria-hidden width={26} height={10} viewBox="0 0 28 10" sx={{ flex: '0 0 auto' }}>
      <line
        x1={1}
        x2={27}
        y1={5}
        y2={5}
        stroke={style.colour}
        strokeWidth={Math.min(style.width, 3.5)}
        strokeDasharray={style.dash || undefined}
        strokeLinecap="butt"
      />
    </Box>
  );
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
 * The spring's force against travel: the baseline on a slow push (where sag is read) and, as
 * overlays, hard landings at other spacer counts and end-stroke pressures, with the sag point and a
 * horizontal line at the hard-landing load. Below it a legend of toggle buttons (keyboard and
 * screen-reader friendly) shows or hides each curve.
 */
export function SpringCurveChart({
  result,
  units,
  title,
  fittedSpacers,
  height = 300,
}: {
  result: PartResult;
  units: UnitPrefs;
  title: string;
  fittedSpacers?: number;
  height?: number;
}) {
  const lengthUnit = unitOf('length', units);
  const printing = usePrintMedia();
  const [hidden, setHidden] = useState<ReadonlySet<string>>(() => new Set());
  const styles = useMemo(() => curveStyles(result, units, fittedSpacers), [result, units, fittedSpacers]);
  const data = useMemo(() => {
    const curves = [result.curve, ...result.overlays.map((o) => o.curve)];
    const { xs, ys } = commonGrid(curves);
    const maxN = Math.max(result.hardLandingLoadN, ...curves.flatMap((c) => c.map((p) => p.forceN)));
    const axis = forceAxis(maxN, units);
    return {
      axis,
      xs: xs.map((x) => toDisplay('length', x, units)),
      ys: ys.map((row) => row.map((y) => (y === null ? null : axis.scale(y)))),
    };
  }, [result, units]);

  const series = styles
    .map((s, i) => ({ s, data: data.ys[i] }))
    .filter(({ s }) => printing || !hidden.has(s.id))
    .map(({ s, data: d }) => ({ id: s.id, label: s.label, data: d, color: s.colour, showMark: false }));
  const lineStyles = Object.fromEntries(
    styles.map((s) => [
      `& path[data-series="${s.id}"]`,
      { strokeWidth: s.width, ...(s.dash ? { strokeDasharray: s.dash } : {}) },
    ]),
  );
  const sagX = toDisplay('length', result.targetSagMm, units);
  const landingY = data.axis.scale(result.hardLandingLoadN);
  const toggle = (id: string) =>
    setHidden((h) => {
      const next = new Set(h);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });

  return (
    <Box>
      <Box
        role="figure"
        aria-label={title}
        className="spring-chart"
        sx={{ width: '100%', '& svg': { overflow: 'visible' } }}
      >
        <Suspense fallback={<Skeleton variant="rounded" height={printing ? 125 : height} />}>
          <SpringCurvePlot
            height={printing ? 125 : height}
            series={series}
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
            sx={lineStyles}
            sagX={sagX}
            landingY={landingY}
          />
        </Suspense>
      </Box>
      <Typography
        variant="caption"
        color="text.secondary"
        component="p"
        className="sheet-screen-only"
        sx={{ mt: 1, mb: 0.5 }}
      >
        The solid line is a slow push, where sag is read; every dashed line is a hard landing. Tap a name to
        hide or show its line.
      </Typography>
      <Box
        role="group"
        aria-label={`Curves on the chart: ${title}`}
        className="chart-legend sheet-screen-only"
        sx={{ display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(155px, 1fr))', gap: 0.5 }}
      >
        {styles.map((s) => {
          const on = !hidden.has(s.id);
          return (
            <ButtonBase
              key={s.id}
              aria-pressed={on}
              onClick={() => toggle(s.id)}
              title={on ? 'Hide this curve' : 'Show this curve'}
              sx={{
                justifyContent: 'flex-start',
                textAlign: 'left',
                gap: 0.75,
                px: 1,
                py: 0.5,
                minHeight: 36,
                borderRadius: 1,
                border: 1,
                borderColor: on ? 'divider' : 'transparent',
                fontSize: '0.8rem',
                color: on ? 'text.primary' : 'text.secondary',
                textDecoration: on ? 'none' : 'line-through',
                bgcolor: on ? 'background.paper' : 'transparent',
                '&.Mui-focusVisible': { outline: `2px solid ${pine[500]}`, outlineOffset: 2 },
              }}
            >
              <CurveSwatch style={s} />
              {s.label}
            </ButtonBase>
          );
        })}
      </Box>
    </Box>
  );
}
