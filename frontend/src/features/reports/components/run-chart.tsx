import Box from '@mui/material/Box';
import { ChartsContainer } from '@mui/x-charts/ChartsContainer';
import { ChartsGrid } from '@mui/x-charts/ChartsGrid';
import { ChartsReferenceLine } from '@mui/x-charts/ChartsReferenceLine';
import { ChartsTooltip } from '@mui/x-charts/ChartsTooltip';
import { ChartsXAxis } from '@mui/x-charts/ChartsXAxis';
import { ChartsYAxis } from '@mui/x-charts/ChartsYAxis';
import { LinePlot } from '@mui/x-charts/LineChart';
import { ScatterPlot } from '@mui/x-charts/ScatterChart';
import type { CurveRun } from '@loamline/shared-types';
import { useMemo } from 'react';
import { formatNumber, toDisplay, type UnitPrefs } from '@/lib/units';
import { ink } from '@/theme/primitives';
import { runChartData } from '../utils/run-chart';
import { forceUnitOf } from '../utils/settings-units';
import { RUN_COLOURS } from './run-colours';

const plain = new Intl.NumberFormat('en', { maximumFractionDigits: 1, useGrouping: false });

/**
 * One bench run: every measured point (compression and rebound) against the model's curve for the
 * settings it was run at, with the travel at sag and the bump stop marked. Lazy-loaded (MUI X
 * Charts is large); the card around it carries the legend and the numbers in words.
 */
export default function RunChart({
  run,
  prefs,
  title,
  height = 280,
}: {
  run: CurveRun;
  prefs: UnitPrefs;
  title: string;
  height?: number;
}) {
  const data = useMemo(() => runChartData(run, prefs), [run, prefs]);
  const lengthUnit = prefs.length;
  const forceUnit = forceUnitOf(prefs);
  const hasModel = data.model.x.length > 1;
  const c = run.comparison;
  const series = [
    ...(hasModel
      ? [
          {
            type: 'line' as const,
            id: 'model-compression',
            label: 'Model, compression',
            data: data.model.compression,
            color: RUN_COLOURS.modelCompression,
            showMark: false,
            xAxisId: 'travel',
          },
          {
            type: 'line' as const,
            id: 'model-rebound',
            label: 'Model, rebound',
            data: data.model.rebound,
            color: RUN_COLOURS.modelRebound,
            showMark: false,
            xAxisId: 'travel',
          },
        ]
      : []),
    {
      type: 'scatter' as const,
      id: 'measured-compression',
      label: 'Measured, compression',
      data: data.compression,
      color: RUN_COLOURS.compression,
      markerSize: 2.5,
      xAxisId: 'travel',
    },
    {
      type: 'scatter' as const,
      id: 'measured-rebound',
      label: 'Measured, rebound',
      data: data.rebound,
      color: RUN_COLOURS.rebound,
      markerSize: 2,
      xAxisId: 'travel',
    },
  ];
  return (
    <Box
      role="img"
      aria-label={`${title}: ${data.compression.length} compression and ${data.rebound.length} rebound points${
        hasModel ? ' against the model' : ''
      }`}
      data-testid="run-chart"
      data-points={data.compression.length + data.rebound.length}
      className="report-chart"
      sx={{
        width: '100%',
        '& svg': { overflow: 'visible' },
        '& path[data-series="model-rebound"]': { strokeDasharray: '6 4' },
        '& path[data-series^="model"]': { strokeWidth: 2 },
      }}
    >
      <ChartsContainer
        height={height}
        series={series}
        skipAnimation
        xAxis={[
          {
            id: 'travel',
            scaleType: 'linear',
            data: hasModel ? data.model.x : undefined,
            min: 0,
            max: data.maxX > 0 ? data.maxX : undefined,
            label: `Travel (${lengthUnit})`,
            valueFormatter: (v: number) => formatNumber(v, lengthUnit === 'in' ? 1 : 0),
          },
        ]}
        yAxis={[
          {
            id: 'force',
            min: 0,
            max: data.maxY > 0 ? data.maxY * 1.05 : undefined,
            label: `Force (${forceUnit})`,
            valueFormatter: (v: number) => plain.format(v),
            width: 58,
          },
        ]}
        margin={{ top: 16, right: 12, bottom: 8, left: 4 }}
      >
        <ChartsGrid horizontal />
        <LinePlot />
        <ScatterPlot />
        {c && (
          <ChartsReferenceLine
            x={toDisplay('length', c.sagTravelMm, prefs)}
            label="sag"
            labelAlign="start"
            axisId="travel"
            lineStyle={{ stroke: ink, strokeDasharray: '3 3' }}
            labelStyle={{ fontSize: 12, fill: ink }}
          />
        )}
        {c?.bumpStopMm != null && (
          <ChartsReferenceLine
            x={toDisplay('length', c.bumpStopMm, prefs)}
            label="bump stop"
            labelAlign="start"
            axisId="travel"
            lineStyle={{ stroke: '#8A2D1F', strokeDasharray: '1 3', strokeWidth: 2 }}
            labelStyle={{ fontSize: 12, fill: '#8A2D1F' }}
          />
        )}
        <ChartsXAxis axisId="travel" />
        <ChartsYAxis axisId="force" />
        <ChartsTooltip trigger="item" />
      </ChartsContainer>
    </Box>
  );
}
