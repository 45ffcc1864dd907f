import { ink, ochre, pine } from '@/theme/primitives';

/*
 * A run's colours, in the chart and its key. Each reads at 3:1 or more on white and the paper
 * (graphics, WCAG 1.4.11), and the strokes differ by shape too: measured points as markers, the
 * model as lines (solid for compression, dashed for rebound), so nothing depends on colour alone.
 */
export const RUN_COLOURS = {
  compression: pine[700],
  rebound: ochre[700],
  modelCompression: ink,
  modelRebound: '#34506B',
};
