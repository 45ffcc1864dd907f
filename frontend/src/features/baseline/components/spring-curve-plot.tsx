import { ChartsReferenceLine } from '@mui/x-charts/ChartsReferenceLine';
import { LineChart, type LineChartProps } from '@mui/x-charts/LineChart';
import { ink } from '@/theme/primitives';

export type SpringCurvePlotProps = Pick<LineChartProps, 'height' | 'series' | 'xAxis' | 'yAxis' | 'sx'> & {
  /** where the sag line stands, in the x axis' unit */
  sagX: number;
  /** the hard-landing load, in the y axis' unit */
  landingY: number;
};

/**
 * The chart itself (MUI X Charts), in its own chunk: SpringCurveChart loads it lazily, so the wizard's
 * steps before the result never download the charting library (docs/performance.md, "First screen").
 */
export default function SpringCurvePlot({ sagX, landingY, ...chart }: SpringCurvePlotProps) {
  return (
    <LineChart
      {...chart}
      skipAnimation
      hideLegend
      grid={{ horizontal: true }}
      margin={{ top: 16, right: 12, bottom: 8, left: 4 }}
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
        label="hard-landing load"
        labelAlign="middle"
        lineStyle={{ stroke: '#8A2D1F', strokeDasharray: '1 3', strokeWidth: 2 }}
        labelStyle={{ fontSize: 12, fill: '#8A2D1F' }}
      />
    </LineChart>
  );
}
